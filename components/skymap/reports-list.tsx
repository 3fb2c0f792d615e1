"use client";

import { useQuery, useQueryClient } from "@tanstack/react-query";
import { FileText, Image as ImageIcon, Paperclip, Table } from "lucide-react";
import { useRef, useState } from "react";
import { toast } from "sonner";
import { Avatar } from "@/components/ui/avatar";
import { Button } from "@/components/ui/button";
import { Panel, PanelTitle } from "@/components/ui/panel";
import { apiFetch } from "@/lib/api-client";
import type { CandidateReport, UploadSummary } from "@/lib/data/uploads";
import { formatInZone, isoUtc } from "@/lib/format/time";
import { taskKindLabels } from "@/lib/triage/task-states";
import { reportFileAccept, reportFileHint, reportFilesField } from "@/lib/validations/uploads";
import { formatBytes } from "./format";
import { ProgressBar } from "./progress-bar";
import { skymapKeys } from "./query-keys";
import { uploadWithProgress } from "./upload-request";

export interface ReportsViewer {
  id: string;
  role: string;
}

/** The candidate's observation reports with their files; authors (and coordinators) attach more files here. */
export function ReportsList({ candidateId, viewer, timeZone }: { candidateId: string; viewer: ReportsViewer; timeZone: string }) {
  const query = useQuery({
    queryKey: skymapKeys.reports(candidateId),
    queryFn: () => apiFetch<{ reports: CandidateReport[] }>(`/api/v1/reports?candidateId=${encodeURIComponent(candidateId)}`).then((r) => r.reports),
  });
  const reports = query.data ?? [];
  return (
    <Panel data-testid="reports-panel">
      <PanelTitle>Observation reports</PanelTitle>
      {query.isLoading ? <p className="text-sm text-muted">Loading reports…</p> : null}
      {query.isError ? <p className="text-sm text-alarm">Could not load reports: {String(query.error)}</p> : null}
      {query.isSuccess && reports.length === 0 ? (
        <p className="text-sm text-muted">No reports yet. Observers report on their tasks from the follow-up board, then attach images, tables or PDFs here.</p>
      ) : null}
      <ul className="space-y-3">
        {reports.map((report) => (
          <li key={report.id} className="rounded-md border border-line p-3">
            <div className="flex flex-wrap items-center gap-2 text-sm">
              {report.author ? <Avatar name={report.author.name} initials={report.author.initials} className="h-5 w-5" /> : null}
              <span className="font-medium">{report.author?.name ?? "Someone"}</span>
              <span className="text-muted">
                {taskKindLabels[report.task.kind as keyof typeof taskKindLabels] ?? report.task.kind}
                {report.task.site ? ` at ${report.task.site.code}` : ""}
              </span>
              <time className="ml-auto text-xs text-faint" dateTime={isoUtc(report.createdAt)} title={`${isoUtc(report.createdAt)} (UTC)`}>
                {formatInZone(report.createdAt, timeZone)}
              </time>
            </div>
            <p className="mt-1 whitespace-pre-wrap text-sm">{report.result}</p>
            {report.files.length ? (
              <ul className="mt-2 flex flex-wrap gap-2">
                {report.files.map((f) => (
                  <FileChip key={f.id} file={f} />
                ))}
              </ul>
            ) : null}
            {viewer.role === "coordinator" || report.author?.id === viewer.id ? <AttachFiles candidateId={candidateId} reportId={report.id} /> : null}
          </li>
        ))}
      </ul>
    </Panel>
  );
}

function FileChip({ file }: { file: UploadSummary }) {
  const Icon = file.mimeType.startsWith("image/") ? ImageIcon : file.mimeType.startsWith("text/") ? Table : FileText;
  return (
    <li>
      <a
        href={file.url}
        className="inline-flex items-center gap-1.5 rounded border border-line bg-sunken px-2 py-1 text-xs hover:border-line-strong"
        title={`${file.mimeType}, sha256 ${file.sha256.slice(0, 12)}…`}
      >
        <Icon aria-hidden className="h-3.5 w-3.5 text-muted" />
        {file.originalName}
        <span className="text-faint">{formatBytes(file.sizeBytes)}</span>
      </a>
    </li>
  );
}

function AttachFiles({ candidateId, reportId }: { candidateId: string; reportId: string }) {
  const queryClient = useQueryClient();
  const input = useRef<HTMLInputElement>(null);
  const [progress, setProgress] = useState<number | null>(null);
  const [error, setError] = useState<string | null>(null);
  const start = async (files: File[]) => {
    setError(null);
    setProgress(0);
    const { done } = uploadWithProgress<{ files: UploadSummary[] }>(
      `/api/v1/reports/${reportId}/files`,
      files.map((file) => ({ field: reportFilesField, file })),
      setProgress,
    );
    const outcome = await done;
    setProgress(null);
    if (input.current) input.current.value = "";
    if (outcome.status === 201) {
      toast.success(`${files.length} file${files.length === 1 ? "" : "s"} attached`);
      void queryClient.invalidateQueries({ queryKey: skymapKeys.reports(candidateId) });
    } else {
      setError("error" in outcome.body ? outcome.body.error : `upload failed (${outcome.status})`);
    }
  };
  return (
    <div className="mt-2 space-y-1">
      <input
        ref={input}
        type="file"
        multiple
        accept={reportFileAccept}
        className="sr-only"
        id={`report-files-${reportId}`}
        onChange={(e) => {
          const files = [...(e.target.files ?? [])];
          if (files.length) void start(files);
        }}
      />
      {progress !== null ? (
        <ProgressBar fraction={progress} label="Uploading files" />
      ) : (
        <Button size="sm" variant="ghost" onClick={() => input.current?.click()}>
          <Paperclip aria-hidden className="h-3.5 w-3.5" /> Attach files
        </Button>
      )}
      <p className="text-xs text-faint">{reportFileHint}</p>
      {error ? (
        <p role="alert" className="text-xs text-alarm">
          {error}
        </p>
      ) : null}
    </div>
  );
}
