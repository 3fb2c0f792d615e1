import { z } from "zod";
import { isP256PublicKey, isPushAuthSecret } from "./push-keys";
import { stages } from "@/db/schema/candidate-values";

/** Local wall-clock time "HH:mm" (24 h). */
export const localTimeSchema = z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, "use HH:mm, 24-hour");

export const escalationTargets = ["primary", "backup", "coordinators"] as const;
export type EscalationTarget = (typeof escalationTargets)[number];

export const policyActions = ["none", "in-app-only"] as const;
export type PolicyAction = (typeof policyActions)[number];

export const escalationStepSchema = z.object({
  target: z.enum(escalationTargets),
  /** minutes after the previous step (the first step: after receipt) */
  afterMinutes: z.coerce.number().min(0).max(240),
});

export const escalationRuleSchema = z.object({
  name: z.string().trim().min(1).max(80),
  /** empty: any stage */
  stages: z.array(z.enum(stages)).default([]),
  /** matches when the false-alarm rate is above this; null: any rate */
  farAbovePerYear: z.coerce.number().min(0).nullable().default(null),
  /** only between nightStart and nightEnd in the on-call primary's time zone */
  nightOnly: z.boolean().default(false),
  action: z.enum(policyActions),
});
export type EscalationRule = z.infer<typeof escalationRuleSchema>;

/**
 * The coordinators' escalation policy (settings key `escalation`). The first matching rule decides; with none
 * matching, every step runs. Default: primary at once, backup 5 min later, coordinators 5 min after that;
 * a withdrawn candidate pages nobody; a candidate with more than one false alarm a month (12 per year, a
 * significance cut common in practice) reaches people only in the app at night.
 */
export const escalationPolicySchema = z
  .object({
    steps: z
      .array(escalationStepSchema)
      .min(1)
      .max(3)
      .default([
        { target: "primary", afterMinutes: 0 },
        { target: "backup", afterMinutes: 5 },
        { target: "coordinators", afterMinutes: 5 },
      ]),
    rules: z
      .array(escalationRuleSchema)
      .max(20)
      .default([
        { name: "Withdrawn by the feed", stages: ["withdrawn"], farAbovePerYear: null, nightOnly: false, action: "none" },
        { name: "Low significance at night", stages: [], farAbovePerYear: 12, nightOnly: true, action: "in-app-only" },
      ]),
    nightStart: localTimeSchema.default("22:00"),
    nightEnd: localTimeSchema.default("07:00"),
    /** a candidate received longer ago than this when stored (a replay, a seed) pages nobody */
    maxAgeMinutes: z.coerce.number().min(1).max(24 * 60).default(60),
  })
  .superRefine((policy, ctx) => {
    const targets = policy.steps.map((s) => s.target);
    if (new Set(targets).size !== targets.length) {
      ctx.addIssue({ code: "custom", path: ["steps"], message: "each target may appear once" });
    }
  });
export type EscalationPolicy = z.infer<typeof escalationPolicySchema>;

const channelSwitches = z.object({ push: z.boolean(), email: z.boolean() });

/** What a person may set about being paged (PUT /api/v1/me/preferences, the settings form). */
export const preferencesSchema = z
  .object({
    push: z.boolean(),
    email: z.boolean(),
    quietStart: localTimeSchema.nullable(),
    quietEnd: localTimeSchema.nullable(),
    taskSiteIds: z.array(z.string().min(1).max(64)).max(100),
    taskChannels: channelSwitches,
  })
  .superRefine((p, ctx) => {
    if ((p.quietStart === null) !== (p.quietEnd === null)) {
      ctx.addIssue({ code: "custom", path: ["quietEnd"], message: "give both ends of quiet hours, or neither" });
    }
    if (p.quietStart !== null && p.quietStart === p.quietEnd) {
      ctx.addIssue({ code: "custom", path: ["quietEnd"], message: "quiet hours must not start and end at the same time" });
    }
  });
export type PreferencesInput = z.infer<typeof preferencesSchema>;

/** `PushSubscription.toJSON()` as a browser gives it, plus a label for the device list. */
export const pushSubscribeSchema = z.object({
  endpoint: z.url({ protocol: /^https?$/ }).max(2048),
  expirationTime: z.number().nullable().optional(),
  keys: z.object({
    p256dh: z.string().max(100).refine(isP256PublicKey, "not a base64url uncompressed point on P-256 (65 bytes, 0x04 first)"),
    auth: z.string().max(30).refine(isPushAuthSecret, "not a base64url 16-byte secret"),
  }),
  label: z.string().trim().max(80).default(""),
});
export type PushSubscribeInput = z.infer<typeof pushSubscribeSchema>;

export const pushUnsubscribeSchema = z.object({ endpoint: z.string().min(1).max(2048) });

export const notificationListQuerySchema = z.object({
  limit: z.coerce.number().int().min(1).max(200).default(50),
  /** only rows created before this instant (ms), for paging back */
  before: z.coerce.number().int().positive().max(8_640_000_000_000_000).optional(), // the last instant a Date holds
  unread: z.enum(["1", "0"]).optional(),
});

export const markReadSchema = z.union([
  z.object({ ids: z.array(z.string().min(1).max(64)).min(1).max(500) }),
  z.object({ all: z.literal(true) }),
]);

/** The settings form's shape (quiet hours as a switch and two time inputs), turned into the API body by `toPreferencesInput`. */
export const preferencesFormSchema = z
  .object({
    push: z.boolean(),
    email: z.boolean(),
    quietEnabled: z.boolean(),
    quietStart: z.string(),
    quietEnd: z.string(),
    taskSiteIds: z.array(z.string()),
    taskPush: z.boolean(),
    taskEmail: z.boolean(),
  })
  .superRefine((f, ctx) => {
    if (!f.quietEnabled) return;
    for (const key of ["quietStart", "quietEnd"] as const) {
      if (!localTimeSchema.safeParse(f[key]).success) ctx.addIssue({ code: "custom", path: [key], message: "use HH:mm, 24-hour" });
    }
    if (f.quietStart === f.quietEnd) ctx.addIssue({ code: "custom", path: ["quietEnd"], message: "quiet hours must not start and end at the same time" });
  });
export type PreferencesFormValues = z.infer<typeof preferencesFormSchema>;

export function toPreferencesInput(f: PreferencesFormValues): PreferencesInput {
  return {
    push: f.push,
    email: f.email,
    quietStart: f.quietEnabled ? f.quietStart : null,
    quietEnd: f.quietEnabled ? f.quietEnd : null,
    taskSiteIds: f.taskSiteIds,
    taskChannels: { push: f.taskPush, email: f.taskEmail },
  };
}
