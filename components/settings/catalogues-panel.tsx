"use client";

import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { Upload } from "lucide-react";
import { useRef, useState } from "react";
import { toast } from "sonner";
import { ProgressBar } from "@/components/skymap/progress-bar";
import { uploadWithProgress } from "@/components/skymap/upload-request";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/field";
import { apiFetch, errorText } from "@/lib/api-client";
import type { CatalogueRecord } from "@/lib/galaxies/catalogue-record";
import type { ImportedCatalogue } from "@/lib/services/import-catalogue";
import { formatInZone } from "@/lib/format/time";

const key = ["catalogues"] as const;

/** Galaxy catalogues: the list for everyone; upload (with progress), default and delete for coordinators. */
export function CataloguesPanel({ canManage, timeZone }: { canManage: boolean; timeZone: string }) {
  const queryClient = useQueryClient();
  const list = useQuery({ queryKey: key, queryFn: () => apiFetch<{ catalogues: CatalogueRecord[] }>("/api/v1/catalogues").then((r) => r.catalogues) });
  const refresh = () => void queryClient.invalidateQueries({ queryKey: key });
  const makeDefault = useMutation({
    mutationFn: (id: string) => apiFetch(`/api/v1/catalogues/${id}`, { method: "PATCH", json: { isDefault: true } }),
    onSuccess: refresh,
    onError: (e) => toast.error(errorText(e)),
  });
  const remove = useMutation({
    mutationFn: (id: string) => apiFetch(`/api/v1/catalogues/${id}`, { method: "DELETE" }),
    onSuccess: refresh,
    onError: (e) => toast.error(errorText(e)),
  });

  return (
    <div className="space-y-4">
      {list.isError ? <p className="text-sm text-alarm">Could not load the catalogues: {errorText(list.error)}</p> : null}
      {list.data && list.data.length === 0 ? <p className="text-sm text-muted">No galaxy catalogue yet.</p> : null}
      {list.data && list.data.length > 0 ? (
        <div className="relative overflow-x-auto">
          <table className="w-full text-sm" data-testid="catalogues-table">
            <thead className="border-b border-line text-left text-xs uppercase tracking-wide text-muted">
              <tr>
                <th className="py-1.5 pr-3 font-medium">Catalogue</th>
                <th className="py-1.5 pr-3 text-right font-medium">Galaxies</th>
                <th className="py-1.5 pr-3 font-medium">Stored</th>
                {canManage ? <th className="py-1.5 font-medium"><span className="sr-only">Actions</span></th> : null}
              </tr>
            </thead>
            <tbody>
              {list.data.map((c) => (
                <tr key={c.id} className="border-b border-line last:border-0">
                  <td className="py-1.5 pr-3">
                    {c.name} {c.isDefault ? <Badge tone="accent">default</Badge> : null} {c.state === "importing" ? <Badge tone="warn">importing</Badge> : null}
                  </td>
                  <td className="py-1.5 pr-3 text-right font-mono">{c.rows.toLocaleString("en-US")}</td>
                  <td className="py-1.5 pr-3 text-xs text-muted">{formatInZone(c.createdAt, timeZone)}</td>
                  {canManage ? (
                    <td className="py-1.5 text-right whitespace-nowrap">
                      {!c.isDefault && c.state === "ready" ? (
                        <Button size="sm" variant="ghost" onClick={() => makeDefault.mutate(c.id)} disabled={makeDefault.isPending}>
                          Make default
                        </Button>
                      ) : null}
                      <Button
                        size="sm"
                        variant="ghost"
                        onClick={() => {
                          if (window.confirm(`Delete the catalogue "${c.name}" and its ${c.rows} galaxies?`)) remove.mutate(c.id);
                        }}
                        disabled={remove.isPending}
                      >
                        Delete
                      </Button>
                    </td>
                  ) : null}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
      {canManage ? <CatalogueUpload onUploaded={refresh} /> : null}
      <p className="text-xs text-faint">
        CSV with the header <code className="font-mono">name,raDeg,decDeg,distanceMpc,weight</code> (weight, a luminosity or mass proxy, may be left
        out: 1), up to 5 000 000 rows. The file is checked as it streams in; a bad row stops the upload, naming the row and column, and nothing is
        kept. The default catalogue is the one candidates&apos; galaxy tables rank.
      </p>
    </div>
  );
}

function CatalogueUpload({ onUploaded }: { onUploaded: () => void }) {
  const input = useRef<HTMLInputElement>(null);
  const [name, setName] = useState("");
  const [progress, setProgress] = useState<{ name: string; fraction: number } | null>(null);
  const [error, setError] = useState<string | null>(null);
  const start = async (file: File) => {
    setError(null);
    setProgress({ name: file.name, fraction: 0 });
    // the server reads the file as it imports it, so the bytes sent follow the rows stored
    const { done } = uploadWithProgress<ImportedCatalogue>("/api/v1/catalogues", [{ field: "file", file }], (fraction) => setProgress({ name: file.name, fraction }), name.trim() ? { name: name.trim() } : {});
    const outcome = await done;
    setProgress(null);
    if (input.current) input.current.value = "";
    if (outcome.status === 201 && "rows" in outcome.body) {
      toast.success(`Catalogue stored: ${outcome.body.rows.toLocaleString("en-US")} galaxies`);
      setName("");
      onUploaded();
    } else {
      setError("error" in outcome.body ? outcome.body.error : `upload failed (${outcome.status})`);
      onUploaded();
    }
  };
  return (
    <div className="space-y-2 border-t border-line pt-3">
      <div className="flex flex-wrap items-end gap-2">
        <label className="text-xs text-muted">
          Name (optional)
          <Input value={name} onChange={(e) => setName(e.target.value)} maxLength={100} className="mt-1 h-8 w-64 py-1 text-sm" placeholder="the file name when empty" />
        </label>
        <input
          ref={input}
          type="file"
          accept=".csv,text/csv"
          className="sr-only"
          data-testid="catalogue-file-input"
          onChange={(e) => {
            const file = e.target.files?.[0];
            if (file) void start(file);
          }}
        />
        {progress ? null : (
          <Button variant="primary" onClick={() => input.current?.click()}>
            <Upload aria-hidden className="h-4 w-4" />
            Upload a catalogue (CSV)
          </Button>
        )}
      </div>
      {progress ? <ProgressBar fraction={progress.fraction} label={`Importing ${progress.name}`} /> : null}
      {error ? (
        <p role="alert" className="text-sm text-alarm" data-testid="catalogue-upload-error">
          {error}
        </p>
      ) : null}
    </div>
  );
}
