"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { Field, Input, Select } from "@/components/ui/field";
import { roles, type Role } from "@/db/schema/roles";
import { roleLabels } from "@/lib/auth/roles";
import { createUserSchema, type CreateUserInput } from "@/lib/validations/users";

export function CreateUserForm({
  allowedRoles,
  onSubmit,
  pending,
}: {
  allowedRoles: readonly Role[];
  onSubmit: (values: CreateUserInput) => void;
  pending: boolean;
}) {
  const form = useForm({
    resolver: zodResolver(createUserSchema),
    defaultValues: { email: "", name: "", role: "shifter" as Role, timeZone: "UTC", password: "" },
  });
  const { errors } = form.formState;
  return (
    <form onSubmit={form.handleSubmit((v) => onSubmit(v as CreateUserInput))} className="space-y-3" noValidate>
      <Field label="Name" htmlFor="new-name" error={errors.name?.message}>
        <Input id="new-name" {...form.register("name")} aria-invalid={!!errors.name} />
      </Field>
      <Field label="E-mail" htmlFor="new-email" error={errors.email?.message}>
        <Input id="new-email" type="email" {...form.register("email")} aria-invalid={!!errors.email} />
      </Field>
      <div className="grid grid-cols-2 gap-3">
        <Field label="Role" htmlFor="new-role" error={errors.role?.message}>
          <Select id="new-role" {...form.register("role")}>
            {roles
              .filter((r) => allowedRoles.includes(r))
              .map((r) => (
                <option key={r} value={r}>
                  {roleLabels[r]}
                </option>
              ))}
          </Select>
        </Field>
        <Field label="Time zone" htmlFor="new-tz" error={errors.timeZone?.message} hint="IANA name, e.g. Europe/Berlin">
          <Input id="new-tz" {...form.register("timeZone")} aria-invalid={!!errors.timeZone} />
        </Field>
      </div>
      <Field label="First password" htmlFor="new-password" error={errors.password?.message} hint="At least 10 characters; tell them to change it.">
        <Input id="new-password" type="password" autoComplete="new-password" {...form.register("password")} aria-invalid={!!errors.password} />
      </Field>
      <div className="flex justify-end">
        <Button type="submit" variant="primary" disabled={pending}>
          {pending ? "Adding…" : "Add person"}
        </Button>
      </div>
    </form>
  );
}
