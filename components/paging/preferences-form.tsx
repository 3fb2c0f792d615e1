"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { ShieldAlert } from "lucide-react";
import { useForm, useWatch } from "react-hook-form";
import { toast } from "sonner";
import { Button } from "@/components/ui/button";
import { Field, Input } from "@/components/ui/field";
import { apiFetch, ApiClientError } from "@/lib/api-client";
import { preferencesFormSchema, toPreferencesInput, type PreferencesFormValues } from "@/lib/validations/paging";
import { pagingKeys } from "./query-keys";
import type { PreferencesView } from "./types";
import { ZonedTime } from "./zoned-time";
import { timeInput24 } from "@/components/ui/iso-inputs";

function Switch({ id, label, hint, ...props }: React.InputHTMLAttributes<HTMLInputElement> & { id: string; label: string; hint?: string }) {
  return (
    <label htmlFor={id} className="flex items-start gap-2 text-sm">
      <input id={id} type="checkbox" className="mt-0.5 h-4 w-4 accent-accent" {...props} />
      <span>
        {label}
        {hint ? <span className="block text-xs text-faint">{hint}</span> : null}
      </span>
    </label>
  );
}

const toForm = (v: PreferencesView): PreferencesFormValues => ({
  push: v.preferences.push,
  email: v.preferences.email,
  quietEnabled: v.preferences.quietStart !== null,
  quietStart: v.preferences.quietStart ?? "22:00",
  quietEnd: v.preferences.quietEnd ?? "07:00",
  taskSiteIds: v.preferences.taskSiteIds,
  taskPush: v.preferences.taskChannels.push,
  taskEmail: v.preferences.taskChannels.email,
});

/** Channels, quiet hours and task sites; the server refuses to let the on-call primary mute pages. */
export function PreferencesForm({ view, showTaskSites }: { view: PreferencesView; showTaskSites: boolean }) {
  const queryClient = useQueryClient();
  const form = useForm<PreferencesFormValues>({ resolver: zodResolver(preferencesFormSchema), defaultValues: toForm(view) });
  const { errors } = form.formState;
  const save = useMutation({
    mutationFn: (values: PreferencesFormValues) => apiFetch<PreferencesView>("/api/v1/me/preferences", { method: "PUT", json: toPreferencesInput(values) }),
    onSuccess: (next) => {
      queryClient.setQueryData(pagingKeys.preferences, next);
      form.reset(toForm(next));
      toast.success("Paging preferences saved.");
    },
    onError: (e) => {
      if (e instanceof ApiClientError && e.status === 422) form.setError("root", { message: e.message });
      else toast.error(e instanceof Error ? e.message : "Could not save");
    },
  });
  const quietOn = useWatch({ control: form.control, name: "quietEnabled" });

  return (
    <form onSubmit={form.handleSubmit((v) => save.mutate(v))} className="space-y-4" noValidate data-testid="paging-preferences">
      {view.onCallUntil ? (
        <p className="flex items-start gap-2 rounded-md border border-warn/40 bg-warn/10 px-3 py-2 text-sm">
          <ShieldAlert aria-hidden className="mt-0.5 h-4 w-4 shrink-0 text-warn" />
          <span>
            You are the on-call primary until <ZonedTime at={view.onCallUntil} timeZone={view.timeZone} />. Pages reach you by push and
            e-mail during your shift whatever you set here; you cannot switch both off.
          </span>
        </p>
      ) : null}
      <fieldset className="space-y-2">
        <legend className="mb-1 text-sm font-medium">Pages about candidates</legend>
        <Switch id="pref-push" label="Web push to my devices" {...form.register("push")} />
        <Switch id="pref-email" label="E-mail" hint="With a one-click acknowledge link." {...form.register("email")} />
      </fieldset>
      <fieldset className="space-y-2">
        <legend className="mb-1 text-sm font-medium">Quiet hours ({view.timeZone})</legend>
        <Switch id="pref-quiet" label="Hold back push and e-mail during quiet hours" hint="Everything still shows in the app; not while you are on call." {...form.register("quietEnabled")} />
        {quietOn ? (
          <div className="grid max-w-sm grid-cols-2 gap-3">
            <Field label="From" htmlFor="pref-quiet-start" error={errors.quietStart?.message}>
              <Input id="pref-quiet-start" {...timeInput24} {...form.register("quietStart")} aria-invalid={!!errors.quietStart} />
            </Field>
            <Field label="Until" htmlFor="pref-quiet-end" error={errors.quietEnd?.message}>
              <Input id="pref-quiet-end" {...timeInput24} {...form.register("quietEnd")} aria-invalid={!!errors.quietEnd} />
            </Field>
          </div>
        ) : null}
      </fieldset>
      {showTaskSites ? (
        <fieldset className="space-y-2">
          <legend className="mb-1 text-sm font-medium">Follow-up tasks</legend>
          <p className="text-xs text-faint">Tell me about new tasks at these sites:</p>
          {view.sites.length === 0 ? <p className="text-sm text-muted">No sites yet.</p> : null}
          <div className="grid gap-1 sm:grid-cols-2">
            {view.sites.map((s) => (
              <Switch key={s.id} id={`pref-site-${s.id}`} value={s.id} label={`${s.code} · ${s.name}`} {...form.register("taskSiteIds")} />
            ))}
          </div>
          <div className="flex flex-wrap gap-4 pt-1">
            <Switch id="pref-task-push" label="by push" {...form.register("taskPush")} />
            <Switch id="pref-task-email" label="by e-mail" {...form.register("taskEmail")} />
          </div>
        </fieldset>
      ) : null}
      {errors.root?.message ? (
        <p role="alert" className="text-sm text-alarm">
          {errors.root.message}
        </p>
      ) : null}
      <div className="flex justify-end">
        <Button type="submit" variant="primary" disabled={save.isPending || !form.formState.isDirty}>
          {save.isPending ? "Saving…" : "Save paging preferences"}
        </Button>
      </div>
    </form>
  );
}
