"use client";

import { Upload } from "lucide-react";
import { useRef, useState } from "react";
import { toast } from "sonner";
import { Button } from "@/components/ui/button";
import type { SkymapUploadAnswer } from "@/lib/validations/skymaps";
import { formatArea } from "./format";
import { ProgressBar } from "./progress-bar";
import { uploadWithProgress } from "./upload-request";

/** Picks a FITS sky map (optionally .gz) and uploads it with a progress bar; reports the server's verdict. */
export function SkymapUpload({ candidateId, onUploaded, compact }: { candidateId: string; onUploaded: () => void; compact?: boolean }) {
  const input = useRef<HTMLInputElement>(null);
  const [progress, setProgress] = useState<{ name: string; fraction: number } | null>(null);
  const [error, setError] = useState<string | null>(null);

  const start = async (file: File) => {
    setError(null);
    setProgress({ name: file.name, fraction: 0 });
    const { done } = uploadWithProgress<SkymapUploadAnswer>(`/api/v1/candidates/${candidateId}/skymaps`, [{ field: "file", file }], (fraction) =>
      setProgress({ name: file.name, fraction }),
    );
    const outcome = await done;
    setProgress(null);
    if (input.current) input.current.value = "";
    if (outcome.status === 201 && "id" in outcome.body) {
      toast.success(`Sky map stored: 90 % region ${formatArea(outcome.body.area90Deg2)}`);
      onUploaded();
    } else {
      const message = "error" in outcome.body ? outcome.body.error : `upload failed (${outcome.status})`;
      setError(message);
      toast.error(message);
    }
  };

  return (
    <div className="space-y-2">
      <input
        ref={input}
        type="file"
        accept=".fits,.fit,.fts,.gz,.fits.gz,application/fits"
        className="sr-only"
        id={`skymap-file-${candidateId}`}
        data-testid="skymap-file-input"
        onChange={(e) => {
          const file = e.target.files?.[0];
          if (file) void start(file);
        }}
      />
      {progress ? (
        <ProgressBar fraction={progress.fraction} label={`Uploading ${progress.name}`} />
      ) : (
        <Button size={compact ? "sm" : "md"} variant={compact ? "secondary" : "primary"} onClick={() => input.current?.click()}>
          <Upload aria-hidden className="h-4 w-4" />
          {compact ? "Upload a newer sky map" : "Upload a sky map (FITS)"}
        </Button>
      )}
      {error ? (
        <p role="alert" className="text-sm text-alarm" data-testid="skymap-upload-error">
          {error}
        </p>
      ) : null}
      {!compact ? <p className="text-xs text-faint">HEALPix FITS, flat (RING or NESTED) or multi-order, optionally gzip&apos;d; up to 200 MB.</p> : null}
    </div>
  );
}
