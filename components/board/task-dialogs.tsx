"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import { z } from "zod";
import { Button } from "@/components/ui/button";
import { Dialog } from "@/components/ui/dialog";
import { Field, Textarea } from "@/components/ui/field";
import { cancelFormSchema, taskReportBodySchema } from "@/lib/validations/tasks";

/** Reporting asks for a short result (files are attached afterwards on the candidate page's report list); cancelling asks why. */
export default function TaskTextDialog({
  mode,
  title,
  onCancel,
  onConfirm,
}: {
  mode: "report" | "cancel";
  title: string;
  onCancel: () => void;
  onConfirm: (text: string) => void;
}) {
  const report = mode === "report";
  // One text field checked by the same rule the route uses (the result or the reason).
  const schema = z.object({ text: report ? taskReportBodySchema.shape.result : cancelFormSchema.shape.reason });
  const { register, handleSubmit, formState } = useForm<{ text: string }>({
    resolver: zodResolver(schema),
    defaultValues: { text: "" },
  });
  return (
    <Dialog open onOpenChange={(open) => !open && onCancel()} title={title} description={report ? "What did you observe? A short result is enough. Attach images, tables or PDFs afterwards under Observation reports on the candidate page." : "Say why, for the observer and the audit log."}>
      <form onSubmit={handleSubmit(({ text }) => onConfirm(text.trim()))} className="space-y-4">
        <Field label={report ? "Result" : "Reason"} htmlFor="task-text" error={formState.errors.text?.message}>
          <Textarea id="task-text" autoFocus aria-invalid={Boolean(formState.errors.text)} {...register("text")} />
        </Field>
        <div className="flex justify-end gap-2">
          <Button variant="ghost" onClick={onCancel}>
            Back
          </Button>
          <Button type="submit" variant={report ? "primary" : "danger"}>
            {report ? "Report" : "Cancel the task"}
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
