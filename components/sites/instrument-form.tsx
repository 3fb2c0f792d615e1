"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useForm, useWatch } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Field, Input, Select } from "@/components/ui/field";
import type { InstrumentRecord } from "@/lib/instruments/service";
import { instrumentFormSchema, type InstrumentFormInput, type InstrumentFormOutput } from "@/lib/validations/instruments";

const text = (v: number | null | undefined) => (v === null || v === undefined ? "" : String(v));

function defaults(instrument?: InstrumentRecord): InstrumentFormInput {
  const f = instrument?.footprint;
  return {
    name: instrument?.name ?? "",
    shape: f?.shape ?? "rectangle",
    widthDeg: f?.shape === "rectangle" ? text(f.widthDeg) : "",
    heightDeg: f?.shape === "rectangle" ? text(f.heightDeg) : "",
    radiusDeg: f?.shape === "circle" ? text(f.radiusDeg) : "",
    filters: instrument?.filters.join(", ") ?? "",
    exposureS: instrument ? text(instrument.exposureS) : "60",
    overheadS: instrument ? text(instrument.overheadS) : "30",
    limitingMag: text(instrument?.limitingMag),
  };
}

type TextName = "name" | "widthDeg" | "heightDeg" | "radiusDeg" | "filters" | "exposureS" | "overheadS" | "limitingMag";

/** Add or edit an instrument; the schema here is the one the route's body schema is built from. */
export function InstrumentForm({
  instrument,
  pending,
  onSubmit,
}: {
  instrument?: InstrumentRecord;
  pending: boolean;
  onSubmit: (values: InstrumentFormOutput) => void;
}) {
  const form = useForm<InstrumentFormInput, unknown, InstrumentFormOutput>({ resolver: zodResolver(instrumentFormSchema), defaultValues: defaults(instrument) });
  const { errors } = form.formState;
  const shape = useWatch({ control: form.control, name: "shape" });
  const input = (name: TextName, props: React.InputHTMLAttributes<HTMLInputElement> = {}) => (
    <Input id={`instrument-${name}`} aria-invalid={Boolean(errors[name])} {...props} {...form.register(name)} />
  );
  return (
    <form onSubmit={form.handleSubmit(onSubmit)} className="space-y-3" noValidate data-testid="instrument-form">
      <Field label="Name" htmlFor="instrument-name" error={errors.name?.message} hint="e.g. Wide camera">
        {input("name")}
      </Field>
      <div className="grid grid-cols-1 gap-3 sm:grid-cols-3">
        <Field label="Footprint" htmlFor="instrument-shape">
          <Select id="instrument-shape" {...form.register("shape")}>
            <option value="rectangle">Rectangle (north up)</option>
            <option value="circle">Circle</option>
          </Select>
        </Field>
        {shape === "circle" ? (
          <Field label="Radius (°)" htmlFor="instrument-radiusDeg" error={errors.radiusDeg?.message} className="sm:col-span-2">
            {input("radiusDeg", { inputMode: "decimal" })}
          </Field>
        ) : (
          <>
            <Field label="Width (°)" htmlFor="instrument-widthDeg" error={errors.widthDeg?.message} hint="east–west">
              {input("widthDeg", { inputMode: "decimal" })}
            </Field>
            <Field label="Height (°)" htmlFor="instrument-heightDeg" error={errors.heightDeg?.message} hint="north–south">
              {input("heightDeg", { inputMode: "decimal" })}
            </Field>
          </>
        )}
      </div>
      <Field label="Filters" htmlFor="instrument-filters" error={errors.filters?.message} hint="comma-separated, e.g. g, r, i; empty for none">
        {input("filters", { autoComplete: "off" })}
      </Field>
      <div className="grid grid-cols-1 gap-3 sm:grid-cols-3">
        <Field label="Default exposure (s)" htmlFor="instrument-exposureS" error={errors.exposureS?.message}>
          {input("exposureS", { inputMode: "numeric" })}
        </Field>
        <Field label="Overhead (s)" htmlFor="instrument-overheadS" error={errors.overheadS?.message} hint="slew + readout, per pointing">
          {input("overheadS", { inputMode: "numeric" })}
        </Field>
        <Field label="Limiting mag" htmlFor="instrument-limitingMag" error={errors.limitingMag?.message} hint="at the default exposure; optional">
          {input("limitingMag", { inputMode: "decimal" })}
        </Field>
      </div>
      <div className="flex justify-end">
        <Button type="submit" variant="primary" disabled={pending}>
          {pending ? "Saving…" : instrument ? "Save instrument" : "Add instrument"}
        </Button>
      </div>
    </form>
  );
}
