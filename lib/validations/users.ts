import { z } from "zod";
import { roles } from "@/db/schema/roles";

/** IANA zone names the runtime knows, so a typo cannot reach the database. */
export const timeZoneSchema = z
  .string()
  .min(1)
  .refine((tz) => {
    try {
      new Intl.DateTimeFormat("en", { timeZone: tz });
      return true;
    } catch {
      return false;
    }
  }, "unknown time zone (use an IANA name such as Europe/Berlin or UTC)");

export const passwordSchema = z.string().min(10, "at least 10 characters").max(200);

export const createUserSchema = z.object({
  email: z.string().trim().toLowerCase().email(),
  name: z.string().trim().min(1).max(100),
  role: z.enum(roles),
  timeZone: timeZoneSchema.default("UTC"),
  password: passwordSchema,
});
export type CreateUserInput = z.infer<typeof createUserSchema>;

export const updateUserSchema = z
  .object({
    name: z.string().trim().min(1).max(100),
    role: z.enum(roles),
    timeZone: timeZoneSchema,
    disabled: z.boolean(),
    password: passwordSchema,
  })
  .partial()
  .refine((v) => Object.keys(v).length > 0, "nothing to change");
export type UpdateUserInput = z.infer<typeof updateUserSchema>;

export const updateProfileSchema = z
  .object({
    name: z.string().trim().min(1).max(100),
    timeZone: timeZoneSchema,
    currentPassword: z.string().min(1),
    newPassword: passwordSchema,
  })
  .partial()
  .refine((v) => !v.newPassword || v.currentPassword, { message: "give your current password", path: ["currentPassword"] })
  .refine((v) => v.name !== undefined || v.timeZone !== undefined || v.newPassword !== undefined, "nothing to change: give name, timeZone or newPassword");
export type UpdateProfileInput = z.infer<typeof updateProfileSchema>;

export const createTokenSchema = z.object({ label: z.string().trim().min(1).max(60) });
