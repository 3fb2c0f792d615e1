import { Inbox } from "lucide-react";
import { redirect } from "next/navigation";
import { localPathOr } from "@/lib/auth/local-path";
import { getSessionUser } from "@/lib/auth/session";
import { SignInForm } from "./sign-in-form";

export const metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<Record<string, string | undefined>> }) {
  const params = await searchParams;
  const callbackUrl = localPathOr(params.callbackUrl, "/");
  if (await getSessionUser()) redirect(callbackUrl);
  return (
    <main className="flex min-h-dvh items-center justify-center p-4">
      <div className="w-full max-w-sm">
        <div className="mb-6 flex items-center gap-2">
          <Inbox className="h-6 w-6 text-accent" aria-hidden />
          <h1 className="text-xl font-semibold tracking-tight">Chirpdesk</h1>
        </div>
        <p className="mb-6 text-sm text-muted">Triage and follow-up of candidate merger triggers. Sign in with your team account.</p>
        <SignInForm callbackUrl={callbackUrl} />
      </div>
    </main>
  );
}
