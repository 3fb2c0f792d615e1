"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation } from "@tanstack/react-query";
import { Plus, Trash2 } from "lucide-react";
import { useFieldArray, useForm } from "react-hook-form";
import { toast } from "sonner";
import type { z } from "zod";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { Field, Input, Select } from "@/components/ui/field";
import { stages } from "@/db/schema/candidates";
import { apiFetch, ApiClientError } from "@/lib/api-client";
import { escalationPolicySchema, escalationTargets, policyActions, type EscalationPolicy } from "@/lib/validations/paging";
import { timeInput24 } from "@/components/ui/iso-inputs";

type FormIn = z.input<typeof escalationPolicySchema>;

const targetText = { primary: "On-call primary", backup: "On-call backup", coordinators: "Coordinators" } as const;

/** Coordinators edit the steps (minutes after the previous step), the night window and the rules. */
export function EscalationPolicyDialog({ policy, onClose, onSaved }: { policy: EscalationPolicy; onClose: () => void; onSaved: (p: EscalationPolicy) => void }) {
  const form = useForm<FormIn, unknown, EscalationPolicy>({ resolver: zodResolver(escalationPolicySchema), defaultValues: policy });
  const steps = useFieldArray({ control: form.control, name: "steps" });
  const rules = useFieldArray({ control: form.control, name: "rules" });
  const { errors } = form.formState;
  const save = useMutation({
    mutationFn: (p: EscalationPolicy) => apiFetch<EscalationPolicy>("/api/v1/escalation-policy", { method: "PUT", json: p }),
    onSuccess: (next) => {
      toast.success("Call-out ladder saved; it applies to candidates from now on.");
      onSaved(next);
    },
    onError: (e) => form.setError("root", { message: e instanceof ApiClientError ? e.message : "Could not save" }),
  });
  return (
    <Dialog open onOpenChange={(o) => !o && onClose()} title="Call-out ladder" description="Steps run in order until someone acknowledges; the first matching rule may soften them.">
      <form onSubmit={form.handleSubmit((p) => save.mutate(p))} className="space-y-4" noValidate>
        <fieldset className="space-y-2">
          <legend className="text-sm font-medium">Steps</legend>
          {errors.steps?.message ? <p className="text-xs text-alarm">{errors.steps.message}</p> : null}
          {steps.fields.map((f, i) => (
            <div key={f.id} className="flex items-end gap-2">
              <Field label={i === 0 ? "Who" : " "} htmlFor={`step-${i}-target`} className="flex-1">
                <Select id={`step-${i}-target`} {...form.register(`steps.${i}.target`)}>
                  {escalationTargets.map((t) => (
                    <option key={t} value={t}>
                      {targetText[t]}
                    </option>
                  ))}
                </Select>
              </Field>
              <Field label={i === 0 ? "Minutes after previous step" : " "} htmlFor={`step-${i}-minutes`} error={errors.steps?.[i]?.afterMinutes?.message} className="w-48">
                <Input id={`step-${i}-minutes`} type="number" min={0} step="any" {...form.register(`steps.${i}.afterMinutes`)} />
              </Field>
              <Button variant="ghost" size="sm" aria-label={`Remove step ${i + 1}`} disabled={steps.fields.length === 1} onClick={() => steps.remove(i)}>
                <Trash2 aria-hidden className="h-4 w-4" />
              </Button>
            </div>
          ))}
          {steps.fields.length < 3 ? (
            <Button size="sm" variant="ghost" onClick={() => steps.append({ target: "coordinators", afterMinutes: 5 })}>
              <Plus aria-hidden className="h-4 w-4" /> Add step
            </Button>
          ) : null}
        </fieldset>
        <div className="grid grid-cols-2 gap-3">
          <Field label="Night starts" htmlFor="night-start" error={errors.nightStart?.message}>
            <Input id="night-start" {...timeInput24} {...form.register("nightStart")} />
          </Field>
          <Field label="Night ends" htmlFor="night-end" error={errors.nightEnd?.message}>
            <Input id="night-end" {...timeInput24} {...form.register("nightEnd")} />
          </Field>
        </div>
        <fieldset className="space-y-3">
          <legend className="text-sm font-medium">Rules (first match wins)</legend>
          {rules.fields.map((f, i) => (
            <div key={f.id} className="space-y-2 rounded-md border border-line p-3">
              <div className="flex items-end gap-2">
                <Field label="Name" htmlFor={`rule-${i}-name`} error={errors.rules?.[i]?.name?.message} className="flex-1">
                  <Input id={`rule-${i}-name`} {...form.register(`rules.${i}.name`)} />
                </Field>
                <Field label="Then" htmlFor={`rule-${i}-action`} className="w-40">
                  <Select id={`rule-${i}-action`} {...form.register(`rules.${i}.action`)}>
                    {policyActions.map((a) => (
                      <option key={a} value={a}>
                        {a === "none" ? "page nobody" : "in the app only"}
                      </option>
                    ))}
                  </Select>
                </Field>
                <Button variant="ghost" size="sm" aria-label={`Remove rule ${i + 1}`} onClick={() => rules.remove(i)}>
                  <Trash2 aria-hidden className="h-4 w-4" />
                </Button>
              </div>
              <div className="flex flex-wrap gap-x-3 gap-y-1 text-sm">
                <span className="text-xs text-faint">Stages (none ticked: any)</span>
                {stages.map((s) => (
                  <label key={s} className="inline-flex items-center gap-1">
                    <input type="checkbox" value={s} className="accent-accent" {...form.register(`rules.${i}.stages`)} /> {s}
                  </label>
                ))}
              </div>
              <div className="flex flex-wrap items-end gap-3">
                <Field label="False alarms above, per year (empty: any)" htmlFor={`rule-${i}-far`} className="w-64">
                  <Input id={`rule-${i}-far`} type="number" min={0} step="any" {...form.register(`rules.${i}.farAbovePerYear`, { setValueAs: (v: unknown) => (v === "" || v === null ? null : Number(v)) })} />
                </Field>
                <label className="inline-flex items-center gap-1 pb-2 text-sm">
                  <input type="checkbox" className="accent-accent" {...form.register(`rules.${i}.nightOnly`)} /> only at night
                </label>
              </div>
            </div>
          ))}
          <Button size="sm" variant="ghost" onClick={() => rules.append({ name: "New rule", stages: [], farAbovePerYear: null, nightOnly: false, action: "in-app-only" })}>
            <Plus aria-hidden className="h-4 w-4" /> Add rule
          </Button>
        </fieldset>
        {errors.root?.message ? (
          <p role="alert" className="text-sm text-alarm">
            {errors.root.message}
          </p>
        ) : null}
        <div className="flex justify-end gap-2">
          <Button onClick={onClose}>Cancel</Button>
          <Button type="submit" variant="primary" disabled={save.isPending}>
            {save.isPending ? "Saving…" : "Save policy"}
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
