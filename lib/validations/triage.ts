import { z } from "zod";
import { triageStates } from "@/db/schema/candidate-values";

const vias = ["board", "menu", "card", "email", "push", "api"] as const;

/** POST /api/v1/candidates/:id/triage */
export const transitionBodySchema = z
  .strictObject({
    to: z.enum(triageStates),
    reason: z.string().trim().max(2000).optional(),
    expectedVersion: z.number().int().min(1).optional(),
    via: z.enum(vias).default("api"),
  })
  .superRefine((body, ctx) => {
    if (body.to === "dismissed" && !body.reason) {
      ctx.addIssue({ code: "custom", path: ["reason"], message: "say why the candidate is dismissed" });
    }
  });
export type TransitionBody = z.input<typeof transitionBodySchema>;

/** The dismiss dialog's form. */
export const dismissFormSchema = z.object({
  reason: z.string().trim().min(3, "say why, in a few words").max(2000),
});
export type DismissForm = z.infer<typeof dismissFormSchema>;

/** POST /api/v1/candidates/:id/assign; ownerId null clears the owner. */
export const assignBodySchema = z.strictObject({
  ownerId: z.string().min(1).nullable(),
  expectedVersion: z.number().int().min(1).optional(),
  via: z.enum(vias).default("api"),
});
export type AssignBody = z.input<typeof assignBodySchema>;
