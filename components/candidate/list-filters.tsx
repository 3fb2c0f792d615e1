"use client";

import { Search } from "lucide-react";
import { useEffect, useState } from "react";
import { cn } from "@/components/ui/cn";
import { Input } from "@/components/ui/field";

/** A row of toggle chips for one multi-value filter (state, stage, class). */
export function ChipFilter<T extends string>({
  label,
  options,
  labels,
  value,
  onChange,
}: {
  label: string;
  options: readonly T[];
  labels: Record<T, string>;
  value: T[];
  onChange: (next: T[]) => void;
}) {
  return (
    <fieldset className="flex flex-wrap items-center gap-1.5">
      <legend className="sr-only">{label}</legend>
      <span aria-hidden className="mr-1 text-xs text-muted">
        {label}
      </span>
      {options.map((option) => {
        const on = value.includes(option);
        return (
          <button
            key={option}
            type="button"
            aria-pressed={on}
            onClick={() => onChange(on ? value.filter((v) => v !== option) : [...value, option])}
            className={cn("rounded-full border px-2.5 py-0.5 text-xs", on ? "border-accent bg-accent/15 text-fg" : "border-line text-muted hover:text-fg")}
          >
            {labels[option]}
          </button>
        );
      })}
    </fieldset>
  );
}

/** Search by candidate id or name, applied after a short pause in typing. */
export function SearchBox({ value, onChange }: { value: string; onChange: (next: string) => void }) {
  const [text, setText] = useState(value);
  useEffect(() => {
    if (text.trim() === value) return;
    const timer = setTimeout(() => onChange(text.trim()), 300);
    return () => clearTimeout(timer);
  }, [text, value, onChange]);
  return (
    <label className="relative block">
      <span className="sr-only">Search by id or name</span>
      <Search aria-hidden className="pointer-events-none absolute left-2.5 top-2.5 h-4 w-4 text-faint" />
      <Input className="w-64 pl-8" type="search" placeholder="Search id or name" value={text} onChange={(e) => setText(e.target.value)} />
    </label>
  );
}
