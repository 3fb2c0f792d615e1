"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useMutation } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useForm } from "react-hook-form";
import { toast } from "sonner";
import { Button } from "@/components/ui/button";
import { Field, Input } from "@/components/ui/field";
import { apiFetch, errorText } from "@/lib/api-client";
import { updateProfileSchema, type UpdateProfileInput } from "@/lib/validations/users";

export function ProfileForm({ name, timeZone }: { name: string; timeZone: string }) {
  const router = useRouter();
  const form = useForm<UpdateProfileInput>({ resolver: zodResolver(updateProfileSchema), defaultValues: { name, timeZone } });
  const { errors } = form.formState;
  const save = useMutation({
    mutationFn: (values: UpdateProfileInput) => {
      const { currentPassword, newPassword, ...rest } = values;
      return apiFetch("/api/v1/me", { method: "PATCH", json: newPassword ? { ...rest, currentPassword, newPassword } : rest });
    },
    onSuccess: (_answer, values) => {
      if (values.newPassword) {
        // A password change ends every session, this one included (lib/auth/options.ts).
        toast.success("Password changed: sign in again with the new one");
        router.push("/sign-in?callbackUrl=/settings");
        return;
      }
      toast.success("Profile saved");
      form.resetField("currentPassword");
      form.resetField("newPassword");
      router.refresh();
    },
    onError: (e) => toast.error(errorText(e)),
  });
  return (
    <form onSubmit={form.handleSubmit((v) => save.mutate(v))} className="grid gap-3 sm:grid-cols-2" noValidate>
      <Field label="Name" htmlFor="profile-name" error={errors.name?.message}>
        <Input id="profile-name" {...form.register("name")} />
      </Field>
      <Field label="Time zone" htmlFor="profile-tz" error={errors.timeZone?.message} hint="Times across Chirpdesk are shown in this zone.">
        <Input id="profile-tz" {...form.register("timeZone")} />
      </Field>
      <Field label="Current password" htmlFor="profile-current" error={errors.currentPassword?.message}>
        <Input id="profile-current" type="password" autoComplete="current-password" {...form.register("currentPassword", { setValueAs: (v: string) => v || undefined })} />
      </Field>
      <Field label="New password" htmlFor="profile-new" error={errors.newPassword?.message} hint="Leave empty to keep your password.">
        <Input id="profile-new" type="password" autoComplete="new-password" {...form.register("newPassword", { setValueAs: (v: string) => v || undefined })} />
      </Field>
      <div className="sm:col-span-2">
        <Button type="submit" variant="primary" disabled={save.isPending}>
          Save profile
        </Button>
      </div>
    </form>
  );
}
