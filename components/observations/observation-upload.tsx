"use client";

import { useQueryClient } from "@tanstack/react-query";
import { Upload } from "lucide-react";
import { useRef, useState } from "react";
import { toast } from "sonner";
import { queryKeys } from "@/components/live/query-keys";
import { ProgressBar } from "@/components/skymap/progress-bar";
import { uploadWithProgress } from "@/components/skymap/upload-request";
import { Button } from "@/components/ui/button";
import { csvColumns, observationCsvField } from "@/lib/validations/observations-csv";

type Answer = { accepted: number; ids: string[] } | { error: string; row?: number; field?: string };

/** Logs a night's exposures for one task from a CSV file (our columns, header row), with upload progress. */
export function ObservationUpload({ taskId, candidateId }: { taskId: string; candidateId: string }) {
  const queryClient = useQueryClient();
  const input = useRef<HTMLInputElement>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const send = async (file: File) => {
    setProblem(null);
    setProgress(0);
    const { done } = uploadWithProgress<Answer>(`/api/v1/tasks/${taskId}/observations/csv`, [{ field: observationCsvField, file }], setProgress);
    const { status, body } = await done;
    setProgress(null);
    if (input.current) input.current.value = "";
    if (status === 201 && "accepted" in body) {
      toast.success(`${body.accepted} exposure${body.accepted === 1 ? "" : "s"} logged`);
      void queryClient.invalidateQueries({ queryKey: queryKeys.coverage(candidateId) });
      void queryClient.invalidateQueries({ queryKey: queryKeys.observations(candidateId) });
    } else {
      setProblem("error" in body ? `${body.error}. Nothing from this file was stored.` : `The upload failed (${status}).`);
    }
  };
  return (
    <div className="mt-2 space-y-1.5">
      <input
        ref={input}
        type="file"
        accept=".csv,text/csv"
        className="sr-only"
        aria-label="CSV file of exposures"
        data-testid={`observation-csv-${taskId}`}
        onChange={(e) => {
          const file = e.target.files?.[0];
          if (file) void send(file);
        }}
      />
      <Button size="sm" variant="secondary" className="h-7 px-2 text-xs" disabled={progress !== null} onClick={() => input.current?.click()}>
        <Upload aria-hidden className="h-3.5 w-3.5" />
        Log exposures (CSV)
      </Button>
      {progress !== null ? <ProgressBar fraction={progress} label="Uploading the log" /> : null}
      {problem ? (
        <p role="alert" className="text-xs text-alarm" data-testid="observation-csv-error">
          {problem}
        </p>
      ) : null}
      <p className="text-xs text-faint">
        Columns: {Object.keys(csvColumns).join(", ")} (a header row; RA and Dec in degrees, start in ISO 8601 UTC, exposure in seconds).
      </p>
    </div>
  );
}
