"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { formatDistanceToNow } from "date-fns";
import { Copy, KeyRound } from "lucide-react";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { toast } from "sonner";
import { Button } from "@/components/ui/button";
import { Field, Input } from "@/components/ui/field";
import { apiFetch, errorText } from "@/lib/api-client";
import { createTokenSchema } from "@/lib/validations/users";

interface TokenRow {
  id: string;
  label: string;
  prefix: string;
  createdAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
}

export function ApiTokens() {
  const queryClient = useQueryClient();
  const [fresh, setFresh] = useState<string | null>(null);
  const tokens = useQuery({ queryKey: ["me", "tokens"], queryFn: () => apiFetch<{ tokens: TokenRow[] }>("/api/v1/me/tokens") });
  const form = useForm({ resolver: zodResolver(createTokenSchema), defaultValues: { label: "" } });
  const create = useMutation({
    mutationFn: (label: string) => apiFetch<{ id: string; token: string }>("/api/v1/me/tokens", { method: "POST", json: { label } }),
    onSuccess: (result) => {
      setFresh(result.token);
      form.reset();
      void queryClient.invalidateQueries({ queryKey: ["me", "tokens"] });
    },
    onError: (e) => toast.error(errorText(e)),
  });
  const revoke = useMutation({
    mutationFn: (id: string) => apiFetch(`/api/v1/me/tokens/${id}`, { method: "DELETE" }),
    onSuccess: () => void queryClient.invalidateQueries({ queryKey: ["me", "tokens"] }),
    onError: (e) => toast.error(errorText(e)),
  });

  return (
    <div className="space-y-3">
      <p className="text-sm text-muted">
        Personal tokens let scripts call <code className="font-mono">/api/v1/*</code> as you, with{" "}
        <code className="font-mono">Authorization: Bearer …</code>. A token is shown once; the server keeps only its hash.
      </p>
      <form onSubmit={form.handleSubmit((v) => create.mutate(v.label))} className="flex flex-wrap items-end gap-2" noValidate>
        <Field label="Label" htmlFor="token-label" error={form.formState.errors.label?.message} className="min-w-56 flex-1">
          <Input id="token-label" placeholder="e.g. review export script" {...form.register("label")} />
        </Field>
        <Button type="submit" variant="primary" disabled={create.isPending}>
          <KeyRound className="h-4 w-4" aria-hidden /> Create token
        </Button>
      </form>
      {fresh ? (
        <div role="status" className="rounded-md border border-warn/50 bg-warn/10 p-3 text-sm">
          <p className="mb-2 font-medium text-warn">Copy this token now; it will not be shown again.</p>
          <div className="flex items-center gap-2">
            <code className="block flex-1 overflow-x-auto rounded bg-sunken p-2 font-mono text-xs" data-testid="fresh-token">
              {fresh}
            </code>
            <Button size="sm" onClick={() => void navigator.clipboard?.writeText(fresh).then(() => toast.success("Copied"))} aria-label="Copy token">
              <Copy className="h-4 w-4" aria-hidden />
            </Button>
          </div>
        </div>
      ) : null}
      <ul className="divide-y divide-line rounded-md border border-line">
        {(tokens.data?.tokens ?? []).map((t) => (
          <li key={t.id} className="flex flex-wrap items-center gap-3 p-2.5 text-sm">
            <span className="font-medium">{t.label}</span>
            <code className="font-mono text-xs text-muted">{t.prefix}…</code>
            <span className="text-xs text-faint">
              made {formatDistanceToNow(new Date(t.createdAt), { addSuffix: true })}
              {t.lastUsedAt ? ` · last used ${formatDistanceToNow(new Date(t.lastUsedAt), { addSuffix: true })}` : " · never used"}
            </span>
            <span className="ml-auto">
              {t.revokedAt ? (
                <span className="text-xs text-faint">revoked</span>
              ) : (
                <Button size="sm" variant="danger" onClick={() => revoke.mutate(t.id)}>
                  Revoke
                </Button>
              )}
            </span>
          </li>
        ))}
        {tokens.data && tokens.data.tokens.length === 0 ? <li className="p-3 text-sm text-muted">No tokens yet.</li> : null}
      </ul>
    </div>
  );
}
