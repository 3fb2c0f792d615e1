"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { Plus, Trash2 } from "lucide-react";
import { useState } from "react";
import { useFieldArray, useForm } from "react-hook-form";
import { SuggestedTasksSlot } from "@/components/candidate/suggested-tasks-slot";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { Field, Input, Select, Textarea } from "@/components/ui/field";
import { taskKinds } from "@/db/schema/task-values";
import { priorityLabels, taskKindLabels } from "@/lib/triage/task-states";
import { anySite, type createTasksBodySchema, createTasksBodySchemaAt, taskWindowMaxAheadDays, type CreateTasksBody, type TaskDraft, type TaskDraftInput } from "@/lib/validations/tasks";
import type { z } from "zod";
import { dateTimeInputIso } from "@/components/ui/iso-inputs";

export interface SiteOption {
  id: string;
  code: string;
  name: string;
}

const blankTask = (): TaskDraftInput => ({ kind: "wide-field-tiling", siteId: "", windowStart: "", windowEnd: "", priority: 2, notes: "" });

/**
 * "Pursue" opens this: plan one or several follow-up tasks (kind, site, window, priority, notes). Submitting moves
 * the candidate to Pursue and creates the tasks; "without tasks" moves it only.
 */
export default function PlanFollowUpDialog({
  candidateId,
  externalId,
  sites,
  onCancel,
  onSubmit,
}: {
  candidateId: string;
  externalId: string;
  sites: SiteOption[];
  onCancel: () => void;
  /** tasks empty: move only. `datetime-local` values are read as the viewer's wall clock (the schema's Date). */
  onSubmit: (tasks: TaskDraft[]) => Promise<void>;
}) {
  const [busy, setBusy] = useState(false);
  const { register, control, handleSubmit, formState } = useForm<CreateTasksBody, unknown, z.output<typeof createTasksBodySchema>>({
    // The 7-day bound is checked against the clock at submit time, not at the dialog's first render.
    resolver: (values, context, options) => zodResolver(createTasksBodySchemaAt(new Date()))(values, context, options),
    defaultValues: { tasks: [blankTask()] },
  });
  const { fields, append, remove } = useFieldArray({ control, name: "tasks" });
  const submit = async (tasks: TaskDraft[]) => {
    setBusy(true);
    try {
      await onSubmit(tasks);
    } finally {
      setBusy(false);
    }
  };
  const errors = formState.errors.tasks;
  return (
    <Dialog open onOpenChange={(open) => !open && onCancel()} title={`Go for follow-up: ${externalId}`} description={`Plan the observations (windows within the next ${taskWindowMaxAheadDays} days). Observers at each site see open tasks on the follow-up board.`}>
      <form
        onSubmit={handleSubmit((values) => submit(values.tasks))}
        className="space-y-4"
      >
        <SuggestedTasksSlot candidateId={candidateId} onAccept={(draft) => append(draft)} />
        {fields.map((field, i) => (
          <fieldset key={field.id} className="space-y-3 rounded-md border border-line p-3">
            <legend className="px-1 text-sm font-medium">Task {i + 1}</legend>
            <div className="grid gap-3 sm:grid-cols-2">
              <Field label="Kind" htmlFor={`task-${i}-kind`} error={errors?.[i]?.kind?.message}>
                <Select id={`task-${i}-kind`} {...register(`tasks.${i}.kind`)}>
                  {taskKinds.map((k) => (
                    <option key={k} value={k}>
                      {taskKindLabels[k]}
                    </option>
                  ))}
                </Select>
              </Field>
              <Field label="Site" htmlFor={`task-${i}-site`} error={errors?.[i]?.siteId?.message}>
                <Select id={`task-${i}-site`} {...register(`tasks.${i}.siteId`)}>
                  {/* No default: an untouched form names no site and is refused until one, or "any site", is chosen. */}
                  <option value="" disabled>
                    Choose a site…
                  </option>
                  <option value={anySite}>Any site</option>
                  {sites.map((s) => (
                    <option key={s.id} value={s.id}>
                      {s.code} · {s.name}
                    </option>
                  ))}
                </Select>
              </Field>
              <Field label="Window opens (your time)" htmlFor={`task-${i}-start`} error={errors?.[i]?.windowStart?.message}>
                <Input id={`task-${i}-start`} {...dateTimeInputIso} {...register(`tasks.${i}.windowStart`)} />
              </Field>
              <Field label="Window closes (your time)" htmlFor={`task-${i}-end`} error={errors?.[i]?.windowEnd?.message}>
                <Input id={`task-${i}-end`} {...dateTimeInputIso} {...register(`tasks.${i}.windowEnd`)} />
              </Field>
              <Field label="Priority" htmlFor={`task-${i}-priority`}>
                <Select id={`task-${i}-priority`} {...register(`tasks.${i}.priority`)}>
                  {[1, 2, 3].map((p) => (
                    <option key={p} value={p}>
                      {priorityLabels[p]}
                    </option>
                  ))}
                </Select>
              </Field>
            </div>
            <Field label="Notes" htmlFor={`task-${i}-notes`} error={errors?.[i]?.notes?.message}>
              <Textarea id={`task-${i}-notes`} className="min-h-14" {...register(`tasks.${i}.notes`)} />
            </Field>
            {fields.length > 1 ? (
              <Button size="sm" variant="ghost" onClick={() => remove(i)}>
                <Trash2 aria-hidden className="h-3.5 w-3.5" />
                Remove task {i + 1}
              </Button>
            ) : null}
          </fieldset>
        ))}
        {errors?.root?.message || errors?.message ? <p role="alert" className="text-sm text-alarm">{errors.root?.message ?? errors.message}</p> : null}
        <div className="flex flex-wrap items-center justify-between gap-2">
          <Button size="sm" variant="secondary" onClick={() => append(blankTask())}>
            <Plus aria-hidden className="h-3.5 w-3.5" />
            Add a task
          </Button>
          <div className="flex flex-wrap gap-2">
            <Button variant="ghost" onClick={onCancel} disabled={busy}>
              Cancel
            </Button>
            <Button variant="secondary" onClick={() => void submit([])} disabled={busy}>
              Pursue without tasks
            </Button>
            <Button type="submit" variant="primary" disabled={busy}>
              Pursue and create {fields.length} task{fields.length === 1 ? "" : "s"}
            </Button>
          </div>
        </div>
      </form>
    </Dialog>
  );
}
