"use client";

import { useMutation } from "@tanstack/react-query";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/field";
import { apiFetch, errorText } from "@/lib/api-client";

/** Probability inside a cone, answered at the map's native resolution by the server. */
export function ConeQuery({ skymapId, initial }: { skymapId: string; initial: { raDeg: number; decDeg: number } }) {
  const [values, setValues] = useState({ raDeg: initial.raDeg.toFixed(2), decDeg: initial.decDeg.toFixed(2), radiusDeg: "5" });
  const query = useMutation({
    mutationFn: () =>
      apiFetch<{ probability: number }>(`/api/v1/skymaps/${skymapId}/cone?${new URLSearchParams(values).toString()}`),
  });
  const field = (key: keyof typeof values, label: string) => (
    <label className="flex flex-col gap-0.5 text-xs text-muted">
      {label}
      <Input
        className="h-8 w-24 py-1 font-mono"
        inputMode="decimal"
        value={values[key]}
        onChange={(e) => setValues((v) => ({ ...v, [key]: e.target.value }))}
      />
    </label>
  );
  return (
    <form
      className="flex flex-wrap items-end gap-2"
      onSubmit={(e) => {
        e.preventDefault();
        query.mutate();
      }}
    >
      {field("raDeg", "RA (deg)")}
      {field("decDeg", "Dec (deg)")}
      {field("radiusDeg", "Radius (deg)")}
      <Button type="submit" size="sm" disabled={query.isPending}>
        Probability in cone
      </Button>
      <output className="min-w-24 text-sm" aria-live="polite">
        {query.data ? <span className="font-mono">{(query.data.probability * 100).toFixed(query.data.probability < 0.1 ? 2 : 1)}&nbsp;%</span> : null}
        {query.error ? (
          <span className="text-alarm">{errorText(query.error)}</span>
        ) : null}
      </output>
    </form>
  );
}
