"use client";

import { QueryClient, QueryClientProvider } from "@tanstack/react-query";
import { ThemeProvider, useTheme } from "next-themes";
import { useState, useSyncExternalStore } from "react";
import { Toaster } from "sonner";

const phoneQuery = "(max-width: 639px)";
const subscribePhone = (onChange: () => void) => {
  const list = window.matchMedia(phoneQuery);
  list.addEventListener("change", onChange);
  return () => list.removeEventListener("change", onChange);
};

/**
 * Toasts in the app's own theme (not the system's: a light toast on the dark desk was unreadable against it), at
 * the top right on a desk screen and at the bottom on a phone, where the top would cover the page title.
 */
function AppToaster() {
  const { resolvedTheme } = useTheme();
  const phone = useSyncExternalStore(subscribePhone, () => window.matchMedia(phoneQuery).matches, () => false);
  return (
    <Toaster
      position={phone ? "bottom-center" : "top-right"}
      offset={{ top: 56, right: 16 }}
      mobileOffset={{ bottom: 16 }}
      theme={resolvedTheme === "light" ? "light" : "dark"}
      richColors
      closeButton
    />
  );
}

export function Providers({ children }: { children: React.ReactNode }) {
  const [queryClient] = useState(
    () =>
      new QueryClient({
        defaultOptions: { queries: { staleTime: 5_000, refetchOnWindowFocus: true, retry: 1 } },
      }),
  );
  return (
    <ThemeProvider attribute="class" defaultTheme="dark" themes={["dark", "light"]} enableSystem={false}>
      <QueryClientProvider client={queryClient}>
        {children}
        <AppToaster />
      </QueryClientProvider>
    </ThemeProvider>
  );
}
