"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation } from "@tanstack/react-query";
import { useForm, type FieldPath } from "react-hook-form";
import { toast } from "sonner";
import { Button } from "@/components/ui/button";
import { Field, Input, Select } from "@/components/ui/field";
import { apiFetch, errorText } from "@/lib/api-client";
import { physicsSettingsInputSchema, type PhysicsSettingsInput } from "@/lib/validations/physics-settings";

interface NumberField {
  name: FieldPath<PhysicsSettingsInput>;
  label: string;
  hint: string;
  step: number;
}

const numberFields: NumberField[] = [
  { name: "nsMaxMassSolar", label: "Neutron-star maximum mass (M☉)", hint: "Below it a component counts as a neutron star. Default 3 (common practice).", step: 0.01 },
  { name: "gapUpperMassSolar", label: "Upper edge of the mass gap (M☉)", hint: "Between the NS maximum and this, a component is in the lower mass gap. Must be above the NS maximum. Default 5.", step: 0.01 },
  { name: "nsRadiusKm", label: "Neutron-star radius (km)", hint: "For the remnant-matter estimate. A star of the maximum mass must stay below Buchdahl's compactness 4/9. Default 12.", step: 0.1 },
  { name: "sampleCount", label: "Monte Carlo samples", hint: "Per trigger for the class probabilities; the standard error falls as 1/√N. Default 20 000.", step: 1000 },
  { name: "pAstroRatePerYear", label: "Expected astrophysical triggers per year", hint: "Above the SNR threshold, for p-astro. Default 50 (order of magnitude, set it for your network).", step: 1 },
  { name: "pAstroSnrThreshold", label: "p-astro SNR threshold", hint: "The network SNR the expected rate is counted above. Default 8 (common practice).", step: 0.5 },
];

/** Coordinators' physics settings; the server checks the role and the consistency again (PUT /api/v1/settings/physics). */
export function PhysicsSettingsForm({ initial }: { initial: PhysicsSettingsInput }) {
  const form = useForm<PhysicsSettingsInput>({ resolver: zodResolver(physicsSettingsInputSchema), defaultValues: initial });
  const { errors } = form.formState;
  const save = useMutation({
    mutationFn: (values: PhysicsSettingsInput) => apiFetch<PhysicsSettingsInput>("/api/v1/settings/physics", { method: "PUT", json: values }),
    onSuccess: (saved) => {
      form.reset(saved);
      toast.success("Physics settings saved; they apply to triggers that arrive from now on");
    },
    onError: (e) => toast.error(errorText(e)),
  });
  return (
    <form onSubmit={form.handleSubmit((v) => save.mutate(v))} className="grid gap-3 sm:grid-cols-2" noValidate data-testid="physics-settings-form">
      <Field
        label="Chirp model"
        htmlFor="physics-chirpModel"
        error={errors.chirpModel?.message}
        hint="3.5PN uses the trigger's mass ratio; leading order is biased by several per cent for black-hole pairs."
      >
        <Select id="physics-chirpModel" {...form.register("chirpModel")}>
          <option value="pn-3.5">3.5PN frequency evolution (TaylorT4)</option>
          <option value="leading-order">Leading-order chirp</option>
        </Select>
      </Field>
      {numberFields.map((f) => (
        <Field key={f.name} label={f.label} htmlFor={`physics-${f.name}`} error={errors[f.name]?.message} hint={f.hint}>
          <Input id={`physics-${f.name}`} type="number" step={f.step} {...form.register(f.name, { valueAsNumber: true })} />
        </Field>
      ))}
      <div className="sm:col-span-2">
        <Button type="submit" variant="primary" disabled={save.isPending}>
          Save physics settings
        </Button>
      </div>
    </form>
  );
}
