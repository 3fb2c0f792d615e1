"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation } from "@tanstack/react-query";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { Field, Input, Select, Textarea } from "@/components/ui/field";
import { apiFetch, ApiClientError } from "@/lib/api-client";
import { instantToLocalInput, toShiftInput } from "@/lib/notify/rota-form";
import { shiftFormSchema, type ShiftFormValues } from "@/lib/validations/rota";
import type { RotaPerson, ShiftView } from "./types";
import { dateTimeInputIso } from "@/components/ui/iso-inputs";

/** API field → form field, so a 422 lands beside the right input. */
const fieldOf: Record<string, keyof ShiftFormValues> = { startsAt: "startsLocal", endsAt: "endsLocal", primaryId: "primaryId", backupId: "backupId", notes: "notes" };

export function ShiftDialog({
  open,
  onOpenChange,
  shift,
  defaults,
  people,
  timeZone,
  onSaved,
}: {
  open: boolean;
  onOpenChange: (open: boolean) => void;
  /** the shift being edited; absent for a new one */
  shift: ShiftView | null;
  defaults: { startsAt: number; endsAt: number };
  people: RotaPerson[];
  timeZone: string;
  onSaved: () => void;
}) {
  const form = useForm<ShiftFormValues>({
    resolver: zodResolver(shiftFormSchema),
    values: {
      // shown as "YYYY-MM-DD HH:mm" (the schema takes the space or a "T")
      startsLocal: instantToLocalInput(shift ? Date.parse(shift.startsAt) : defaults.startsAt, timeZone).replace("T", " "),
      endsLocal: instantToLocalInput(shift ? Date.parse(shift.endsAt) : defaults.endsAt, timeZone).replace("T", " "),
      primaryId: shift?.primary.id ?? "",
      backupId: shift?.backup?.id ?? "",
      notes: shift?.notes ?? "",
    },
  });
  const { errors } = form.formState;
  const save = useMutation({
    mutationFn: (values: ShiftFormValues) =>
      apiFetch(shift ? `/api/v1/rota/${encodeURIComponent(shift.id)}` : "/api/v1/rota", { method: shift ? "PUT" : "POST", json: toShiftInput(values, timeZone) }),
    onSuccess: () => {
      onSaved();
      onOpenChange(false);
    },
    onError: (e) => {
      const issues = e instanceof ApiClientError ? (e.body.issues ?? []) : [];
      for (const issue of issues) {
        const field = fieldOf[issue.path.split(".")[0] ?? ""];
        if (field) form.setError(field, { message: issue.message });
      }
      if (issues.length === 0) form.setError("root", { message: e instanceof Error ? e.message : "Could not save" });
    },
  });
  return (
    <Dialog open={open} onOpenChange={onOpenChange} title={shift ? "Change shift" : "Add shift"} description={`Times in ${timeZone}; stored in UTC.`}>
      <form onSubmit={form.handleSubmit((v) => save.mutate(v))} className="space-y-3" noValidate>
        <div className="grid grid-cols-2 gap-3">
          <Field label="Starts" htmlFor="shift-start" error={errors.startsLocal?.message}>
            <Input id="shift-start" {...dateTimeInputIso} {...form.register("startsLocal")} aria-invalid={!!errors.startsLocal} />
          </Field>
          <Field label="Ends" htmlFor="shift-end" error={errors.endsLocal?.message}>
            <Input id="shift-end" {...dateTimeInputIso} {...form.register("endsLocal")} aria-invalid={!!errors.endsLocal} />
          </Field>
        </div>
        <div className="grid grid-cols-2 gap-3">
          <Field label="Primary" htmlFor="shift-primary" error={errors.primaryId?.message} hint="Paged first">
            <Select id="shift-primary" {...form.register("primaryId")} aria-invalid={!!errors.primaryId}>
              <option value="">Choose…</option>
              {people.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.name}
                </option>
              ))}
            </Select>
          </Field>
          <Field label="Backup" htmlFor="shift-backup" error={errors.backupId?.message} hint="Paged if nobody acknowledges">
            <Select id="shift-backup" {...form.register("backupId")} aria-invalid={!!errors.backupId}>
              <option value="">None</option>
              {people.map((p) => (
                <option key={p.id} value={p.id}>
                  {p.name}
                </option>
              ))}
            </Select>
          </Field>
        </div>
        <Field label="Notes" htmlFor="shift-notes" error={errors.notes?.message}>
          <Textarea id="shift-notes" {...form.register("notes")} />
        </Field>
        {errors.root?.message ? (
          <p role="alert" className="text-sm text-alarm">
            {errors.root.message}
          </p>
        ) : null}
        <div className="flex justify-end gap-2">
          <Button onClick={() => onOpenChange(false)}>Cancel</Button>
          <Button type="submit" variant="primary" disabled={save.isPending}>
            {save.isPending ? "Saving…" : shift ? "Save shift" : "Add shift"}
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
