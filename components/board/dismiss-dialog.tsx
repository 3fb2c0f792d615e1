"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { Field, Textarea } from "@/components/ui/field";
import { dismissFormSchema, type DismissForm } from "@/lib/validations/triage";

/** Dismissing always asks why; the reason goes into the audit log. */
export default function DismissDialog({
  externalId,
  onCancel,
  onConfirm,
}: {
  externalId: string;
  onCancel: () => void;
  onConfirm: (reason: string) => void;
}) {
  const { register, handleSubmit, formState } = useForm<DismissForm>({ resolver: zodResolver(dismissFormSchema), defaultValues: { reason: "" } });
  return (
    <Dialog open onOpenChange={(open) => !open && onCancel()} title={`Dismiss ${externalId}`} description="Say why, for the audit log and the next shift.">
      <form onSubmit={handleSubmit(({ reason }) => onConfirm(reason))} className="space-y-4">
        <Field label="Reason" htmlFor="dismiss-reason" error={formState.errors.reason?.message}>
          <Textarea id="dismiss-reason" autoFocus aria-invalid={Boolean(formState.errors.reason)} placeholder="e.g. instrumental glitch in S1" {...register("reason")} />
        </Field>
        <div className="flex justify-end gap-2">
          <Button variant="ghost" onClick={onCancel}>
            Keep it
          </Button>
          <Button type="submit" variant="danger">
            Dismiss
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
