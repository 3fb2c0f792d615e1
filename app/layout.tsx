import type { Metadata, Viewport } from "next";
import localFont from "next/font/local";
import { Providers } from "@/components/providers";
import "./globals.css";

const inter = localFont({ src: "./fonts/inter-var.woff2", variable: "--font-inter", display: "swap" });
const jetbrains = localFont({ src: "./fonts/jetbrains-mono-var.woff2", variable: "--font-jetbrains", display: "swap" });

export const metadata: Metadata = {
  title: { default: "Chirpdesk", template: "%s · Chirpdesk" },
  description: "Triage and follow-up of gravitational-wave candidate triggers",
  manifest: "/manifest.webmanifest",
  icons: { icon: "/icon.svg" },
};

export const viewport: Viewport = {
  themeColor: "#0a0e17",
  width: "device-width",
  initialScale: 1,
};

export default function RootLayout({ children }: { children: React.ReactNode }) {
  return (
    <html lang="en" className={`${inter.variable} ${jetbrains.variable} dark`} suppressHydrationWarning>
      <body className="min-h-dvh font-sans antialiased">
        <Providers>{children}</Providers>
      </body>
    </html>
  );
}
