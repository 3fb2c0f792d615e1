"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation } from "@tanstack/react-query";
import { Timer } from "lucide-react";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { toast } from "sonner";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { Field, Input } from "@/components/ui/field";
import { apiFetch, errorText } from "@/lib/api-client";
import { acknowledgeDeadlineMinutes, deadlinesSchema, type DeadlinesInput } from "@/lib/validations/review";

const fields: Array<{ key: keyof DeadlinesInput; label: string; hint: string }> = [
  { key: "feedLatencyMinutes", label: "Feed latency", hint: "merger → receipt" },
  { key: "pageMinutes", label: "Paging", hint: "receipt → first page sent" },
  { key: "acknowledgeStepMinutes", label: "Acknowledgement", hint: "first page → acknowledged; with paging, the deadline from receipt" },
  { key: "decisionMinutes", label: "Triage decision", hint: "acknowledged → decision" },
  { key: "claimMinutes", label: "Follow-up claim", hint: "pursue → first claim" },
  { key: "reportMinutes", label: "First report", hint: "first claim → first report" },
  { key: "firstExposureMinutes", label: "First exposure", hint: "merger → first exposure" },
  { key: "covered50Minutes", label: "Half the sky", hint: "merger → 50 % of the probability observed" },
  { key: "covered90Minutes", label: "Most of the sky", hint: "merger → 90 % observed" },
  { key: "acknowledgeWarnMinutes", label: "Board: warn after", hint: "from receipt, card timer turns amber" },
];

/** The one acknowledgement deadline the two steps add up to, as the form stands. */
function AckDeadlineNote({ page, acknowledge }: { page: number; acknowledge: number }) {
  const total = Number.isFinite(page) && Number.isFinite(acknowledge) ? acknowledgeDeadlineMinutes({ pageMinutes: page, acknowledgeStepMinutes: acknowledge }) : null;
  return (
    <p className="rounded-md border border-line bg-raised px-3 py-2 text-sm" data-testid="ack-deadline-note">
      Acknowledgement deadline:{" "}
      <strong className="whitespace-nowrap">{total === null ? "—" : `${Number(total.toFixed(2))}\u00a0min`}</strong> after receipt (paging +
      acknowledgement). The board shows a card as overdue from then, and the review counts an acknowledgement after it
      as late.
    </p>
  );
}

/** Coordinators' editor for every deadline, in minutes; the server checks the role again (PUT /api/v1/settings/deadlines). */
export function DeadlinesDialog({ initial }: { initial: DeadlinesInput }) {
  const router = useRouter();
  const [open, setOpen] = useState(false);
  const form = useForm<DeadlinesInput>({ resolver: zodResolver(deadlinesSchema), defaultValues: initial });
  const save = useMutation({
    mutationFn: (values: DeadlinesInput) => apiFetch<DeadlinesInput>("/api/v1/settings/deadlines", { method: "PUT", json: values }),
    onSuccess: (saved) => {
      toast.success("Deadlines saved; figures re-evaluated");
      form.reset(saved);
      setOpen(false);
      router.refresh();
    },
    onError: (e) => toast.error(errorText(e)),
  });
  return (
    <>
      <Button onClick={() => setOpen(true)} size="sm">
        <Timer aria-hidden className="h-4 w-4" /> Deadlines
      </Button>
      <Dialog open={open} onOpenChange={setOpen} title="Step deadlines" description="Minutes per step. Stored events stay as they are; every figure is re-evaluated.">
        <form onSubmit={form.handleSubmit((v) => save.mutate(v))} className="space-y-3" noValidate>
          <div className="grid gap-3 sm:grid-cols-2">
            {fields.map((f) => {
              const error = form.formState.errors[f.key]?.message;
              return (
                <Field key={f.key} label={`${f.label} (min)`} htmlFor={`deadline-${f.key}`} hint={f.hint} error={error}>
                  <Input
                    id={`deadline-${f.key}`}
                    type="number"
                    step="any"
                    inputMode="decimal"
                    aria-invalid={error ? true : undefined}
                    {...form.register(f.key, { valueAsNumber: true })}
                  />
                </Field>
              );
            })}
          </div>
          <AckDeadlineNote page={form.watch("pageMinutes")} acknowledge={form.watch("acknowledgeStepMinutes")} />
          <div className="flex justify-end gap-2">
            <Button onClick={() => setOpen(false)}>Cancel</Button>
            <Button type="submit" variant="primary" disabled={save.isPending}>
              {save.isPending ? "Saving…" : "Save deadlines"}
            </Button>
          </div>
        </form>
      </Dialog>
    </>
  );
}
