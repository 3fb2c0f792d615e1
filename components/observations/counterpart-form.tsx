"use client";

import { useMutation, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { toast } from "sonner";
import { queryKeys } from "@/components/live/query-keys";
import { Button } from "@/components/ui/button";
import { Field, Input, Textarea } from "@/components/ui/field";
import { ApiClientError, apiFetch, errorText } from "@/lib/api-client";
import type { CounterpartAnswer } from "@/lib/services/report-counterpart";

const empty = { raDeg: "", decDeg: "", observedAt: "", magnitude: "", magnitudeError: "", filter: "", name: "", notes: "" };
type Values = typeof empty;

/** Numbers and optional texts of the form as the API's JSON (blank optional fields left out). */
function toBody(v: Values): Record<string, unknown> {
  const body: Record<string, unknown> = { raDeg: Number(v.raDeg), decDeg: Number(v.decDeg), observedAt: v.observedAt.trim(), notes: v.notes };
  if (v.magnitude.trim()) body.magnitude = Number(v.magnitude);
  if (v.magnitudeError.trim()) body.magnitudeError = Number(v.magnitudeError);
  if (v.filter.trim()) body.filter = v.filter.trim();
  if (v.name.trim()) body.name = v.name.trim();
  return body;
}

export function CounterpartForm({ candidateId }: { candidateId: string }) {
  const queryClient = useQueryClient();
  const [values, setValues] = useState<Values>(empty);
  const [open, setOpen] = useState(false);
  const [fieldError, setFieldError] = useState<{ path: string; message: string } | null>(null);
  const report = useMutation({
    mutationFn: (body: Record<string, unknown>) => apiFetch<CounterpartAnswer>(`/api/v1/candidates/${candidateId}/counterparts`, { method: "POST", json: body }),
    onSuccess: (answer) => {
      if (answer.warning) toast.warning(answer.warning);
      else toast.success("Counterpart reported");
      setValues(empty);
      setFieldError(null);
      setOpen(false);
      void queryClient.invalidateQueries({ queryKey: queryKeys.counterparts(candidateId) });
    },
    onError: (e) => {
      const issue = e instanceof ApiClientError ? e.body.issues?.[0] : undefined;
      setFieldError(issue ?? null);
      toast.error(errorText(e));
    },
  });
  const set = (key: keyof Values) => (e: React.ChangeEvent<HTMLInputElement | HTMLTextAreaElement>) => setValues((v) => ({ ...v, [key]: e.target.value }));
  const errorFor = (key: keyof Values) => (fieldError?.path === key ? fieldError.message : undefined);
  if (!open) {
    return (
      <Button className="mt-3" size="sm" onClick={() => setOpen(true)}>
        Report a counterpart
      </Button>
    );
  }
  const text = (key: keyof Values, label: string, hint?: string, inputMode?: "decimal") => (
    <Field label={label} htmlFor={`cp-${key}`} error={errorFor(key)} hint={hint}>
      <Input id={`cp-${key}`} value={values[key]} onChange={set(key)} inputMode={inputMode} aria-invalid={Boolean(errorFor(key))} />
    </Field>
  );
  return (
    <form
      className="mt-3 grid gap-3 border-t border-line pt-3 sm:grid-cols-2"
      aria-label="Report a counterpart"
      onSubmit={(e) => {
        e.preventDefault();
        report.mutate(toBody(values));
      }}
    >
      {text("raDeg", "RA (degrees)", "0 to 360", "decimal")}
      {text("decDeg", "Dec (degrees)", "−90 to +90", "decimal")}
      {text("observedAt", "Seen at (UTC)", "e.g. 2026-12-04T05:10:00Z")}
      {text("name", "Name", "optional")}
      {text("magnitude", "Magnitude", "optional", "decimal")}
      {text("magnitudeError", "Magnitude error", "optional", "decimal")}
      {text("filter", "Filter", "optional")}
      <Field label="Notes" htmlFor="cp-notes" error={errorFor("notes")} className="sm:col-span-2">
        <Textarea id="cp-notes" value={values.notes} onChange={set("notes")} rows={2} />
      </Field>
      <div className="flex gap-2 sm:col-span-2">
        <Button type="submit" variant="primary" size="sm" disabled={report.isPending}>
          {report.isPending ? "Reporting…" : "Report"}
        </Button>
        <Button size="sm" variant="ghost" onClick={() => setOpen(false)}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
