"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { Controller, useForm, useWatch } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Field, Input, Select } from "@/components/ui/field";
import type { SiteObserver, SiteRecord } from "@/lib/data/sites";
import { siteFormSchema, type SiteFormInput, type SiteInput } from "@/lib/validations/sites";

function defaults(site?: SiteRecord): SiteFormInput {
  return {
    code: site?.code ?? "",
    name: site?.name ?? "",
    latitudeDeg: site ? String(site.latitudeDeg) : "",
    longitudeDeg: site ? String(site.longitudeDeg) : "",
    elevationM: site ? String(site.elevationM) : "",
    limitKind: "altitude",
    minAltitudeDeg: site ? String(site.minAltitudeDeg) : "30",
    maxAirmass: "2",
    moonDistanceDeg: site ? String(site.moonDistanceDeg) : "20",
    fieldOfViewDeg2: site ? String(site.fieldOfViewDeg2) : "",
    timeZone: site?.timeZone ?? "UTC",
    observerIds: site?.observers.map((o) => o.id) ?? [],
  };
}

/** Create or edit a site; the same zod schema checks it here and in the route. */
export function SiteForm({
  site,
  observerOptions,
  pending,
  onSubmit,
}: {
  site?: SiteRecord;
  observerOptions: SiteObserver[];
  pending: boolean;
  onSubmit: (values: SiteInput) => void;
}) {
  const form = useForm<SiteFormInput, unknown, SiteInput>({ resolver: zodResolver(siteFormSchema), defaultValues: defaults(site) });
  const { errors } = form.formState;
  const limitKind = useWatch({ control: form.control, name: "limitKind" });
  const text = (name: "code" | "name" | "latitudeDeg" | "longitudeDeg" | "elevationM" | "fieldOfViewDeg2" | "timeZone" | "minAltitudeDeg" | "maxAirmass" | "moonDistanceDeg", props: React.InputHTMLAttributes<HTMLInputElement> = {}) => (
    <Input id={`site-${name}`} aria-invalid={Boolean(errors[name])} {...props} {...form.register(name)} />
  );
  return (
    <form onSubmit={form.handleSubmit(onSubmit)} className="space-y-3" noValidate data-testid="site-form">
      <div className="grid grid-cols-3 gap-3">
        <Field label="Code" htmlFor="site-code" error={errors.code?.message} hint="e.g. ALD">
          {text("code", { className: "font-mono uppercase" })}
        </Field>
        <Field label="Name" htmlFor="site-name" error={errors.name?.message} className="col-span-2">
          {text("name")}
        </Field>
      </div>
      <div className="grid grid-cols-3 gap-3">
        <Field label="Latitude (°)" htmlFor="site-latitudeDeg" error={errors.latitudeDeg?.message} hint="north positive">
          {text("latitudeDeg", { inputMode: "decimal" })}
        </Field>
        <Field label="Longitude (°)" htmlFor="site-longitudeDeg" error={errors.longitudeDeg?.message} hint="east positive">
          {text("longitudeDeg", { inputMode: "decimal" })}
        </Field>
        <Field label="Elevation (m)" htmlFor="site-elevationM" error={errors.elevationM?.message}>
          {text("elevationM", { inputMode: "decimal" })}
        </Field>
      </div>
      <div className="grid grid-cols-3 gap-3">
        <Field label="Limit given as" htmlFor="site-limitKind">
          <Select id="site-limitKind" {...form.register("limitKind")}>
            <option value="altitude">Lowest altitude</option>
            <option value="airmass">Highest airmass</option>
          </Select>
        </Field>
        {limitKind === "airmass" ? (
          <Field label="Highest airmass" htmlFor="site-maxAirmass" error={errors.maxAirmass?.message} hint="stored as an altitude (sec z)">
            {text("maxAirmass", { inputMode: "decimal" })}
          </Field>
        ) : (
          <Field label="Lowest altitude (°)" htmlFor="site-minAltitudeDeg" error={errors.minAltitudeDeg?.message}>
            {text("minAltitudeDeg", { inputMode: "decimal" })}
          </Field>
        )}
        <Field label="Field of view (deg²)" htmlFor="site-fieldOfViewDeg2" error={errors.fieldOfViewDeg2?.message}>
          {text("fieldOfViewDeg2", { inputMode: "decimal" })}
        </Field>
      </div>
      <div className="grid grid-cols-3 gap-3">
        <Field label="Time zone" htmlFor="site-timeZone" error={errors.timeZone?.message} hint="IANA name, e.g. America/Santiago" className="col-span-2">
          {text("timeZone")}
        </Field>
        <Field label="Least Moon distance (°)" htmlFor="site-moonDistanceDeg" error={errors.moonDistanceDeg?.message} hint="plans keep pointings this far from the Moon; empty: 20°">
          {text("moonDistanceDeg", { inputMode: "decimal" })}
        </Field>
      </div>
      <fieldset className="space-y-1">
        <legend className="text-sm font-medium">Observers who work there</legend>
        <Controller
          control={form.control}
          name="observerIds"
          render={({ field }) => {
            const chosen = new Set(field.value ?? []);
            return (
              <div className="grid max-h-36 grid-cols-2 gap-1 overflow-y-auto rounded-md border border-line bg-sunken p-2 text-sm">
                {observerOptions.length === 0 ? <p className="text-xs text-muted">No observers yet.</p> : null}
                {observerOptions.map((o) => (
                  <label key={o.id} className="flex items-center gap-2">
                    <input
                      type="checkbox"
                      checked={chosen.has(o.id)}
                      onChange={(e) => {
                        const next = new Set(chosen);
                        if (e.target.checked) next.add(o.id);
                        else next.delete(o.id);
                        field.onChange([...next]);
                      }}
                    />
                    {o.name}
                  </label>
                ))}
              </div>
            );
          }}
        />
      </fieldset>
      <div className="flex justify-end">
        <Button type="submit" variant="primary" disabled={pending}>
          {pending ? "Saving…" : site ? "Save site" : "Add site"}
        </Button>
      </div>
    </form>
  );
}
