"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation } from "@tanstack/react-query";
import { useForm } from "react-hook-form";
import { toast } from "sonner";
import { Button } from "@/components/ui/button";
import { Field, Input, Select } from "@/components/ui/field";
import { apiFetch, errorText } from "@/lib/api-client";
import { groupingInputSchema, type GroupingInput } from "@/lib/validations/grouping";

/** Coordinators' grouping settings; the server checks the role again (PUT /api/v1/settings/grouping). */
export function GroupingForm({ initial }: { initial: GroupingInput }) {
  const form = useForm<GroupingInput>({ resolver: zodResolver(groupingInputSchema), defaultValues: initial });
  const { errors } = form.formState;
  const save = useMutation({
    mutationFn: (values: GroupingInput) => apiFetch<GroupingInput>("/api/v1/settings/grouping", { method: "PUT", json: values }),
    onSuccess: () => toast.success("Grouping saved; it applies to triggers that arrive from now on"),
    onError: (e) => toast.error(errorText(e)),
  });
  return (
    <form onSubmit={form.handleSubmit((v) => save.mutate(v))} className="grid gap-3 sm:grid-cols-2" noValidate>
      <Field
        label="Coincidence window (ms)"
        htmlFor="grouping-window"
        error={errors.coincidenceWindowMs?.message}
        hint="A new trigger within ± this of a live candidate's trigger joins it (edge included)."
      >
        <Input id="grouping-window" type="number" min={0} max={10_000} step={1} {...form.register("coincidenceWindowMs", { valueAsNumber: true })} />
      </Field>
      <Field label="Preferred trigger" htmlFor="grouping-rule" hint="The trigger whose numbers the candidate shows.">
        <Select id="grouping-rule" {...form.register("preferredBy")}>
          <option value="lowest-far">Lowest false-alarm rate, ties to the highest SNR</option>
          <option value="highest-snr">Highest network SNR, ties to the lowest false-alarm rate</option>
        </Select>
      </Field>
      <div className="sm:col-span-2">
        <Button type="submit" variant="primary" disabled={save.isPending}>
          Save grouping
        </Button>
      </div>
    </form>
  );
}
