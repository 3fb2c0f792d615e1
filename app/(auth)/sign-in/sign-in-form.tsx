"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { signIn } from "next-auth/react";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Field, Input } from "@/components/ui/field";
import { signInSchema, type SignInValues } from "@/lib/validations/auth";

function describe(result: { error: string | null; status: number } | undefined): string {
  if (!result) return "Sign-in did not answer; check your connection.";
  if (result.status === 429) return "Too many failed attempts for this account or address. Wait 15 minutes, or ask a coordinator to reset your password.";
  if (result.error === "CredentialsSignin") return "That e-mail and password do not match an active account.";
  return `Sign-in failed (${result.error ?? result.status}).`;
}

export function SignInForm({ callbackUrl }: { callbackUrl: string }) {
  const [message, setMessage] = useState<string | null>(null);
  const form = useForm<SignInValues>({ resolver: zodResolver(signInSchema), defaultValues: { email: "", password: "" } });
  const { errors, isSubmitting } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    setMessage(null);
    const result = await signIn("credentials", { ...values, redirect: false, callbackUrl });
    if (result?.ok && !result.error) {
      window.location.assign(callbackUrl);
      return;
    }
    setMessage(describe(result));
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4 rounded-lg border border-line bg-surface p-5">
      <Field label="E-mail" htmlFor="email" error={errors.email?.message}>
        <Input id="email" type="email" autoComplete="username" aria-invalid={!!errors.email} {...form.register("email")} />
      </Field>
      <Field label="Password" htmlFor="password" error={errors.password?.message}>
        <Input
          id="password"
          type="password"
          autoComplete="current-password"
          aria-invalid={!!errors.password}
          {...form.register("password")}
        />
      </Field>
      {message ? (
        <p role="alert" data-testid="sign-in-error" className="rounded-md border border-alarm/40 bg-alarm/10 p-2 text-sm text-alarm">
          {message}
        </p>
      ) : null}
      <Button type="submit" variant="primary" className="w-full" disabled={isSubmitting}>
        {isSubmitting ? "Signing in…" : "Sign in"}
      </Button>
    </form>
  );
}
