import { z } from "zod";
import { ALERT_KINDS } from "@/lib/alerts/rules";

const hhmm = z.string().regex(/^([01][0-9]|2[0-3]):[0-5][0-9]$/, "Use HH:MM, 24-hour");

export const alertRuleSchema = z.object({
  kind: z.enum(ALERT_KINDS),
  enabled: z.boolean(),
  push: z.boolean(),
  email: z.boolean(),
  threshold: z.number().min(0).max(1000).nullable(),
});

export const alertSettingsSchema = z
  .object({
    quietStart: hhmm.nullable(),
    quietEnd: hhmm.nullable(),
    digestOnly: z.boolean(),
    digestHour: z.number().int().min(0).max(23),
  })
  .refine((s) => (s.quietStart === null) === (s.quietEnd === null), { message: "Give both ends of the quiet hours, or neither", path: ["quietEnd"] });

/** PUT body of a person's alert preferences on one farm: any rules they change, and the settings. */
export const alertPreferencesSchema = z.object({
  rules: z.array(alertRuleSchema).max(ALERT_KINDS.length).default([]),
  settings: alertSettingsSchema.optional(),
});

/** A browser's PushSubscription.toJSON(), as the Push API gives it. */
export const pushSubscriptionSchema = z.object({
  endpoint: z.url({ protocol: /^https$/ }).max(2000),
  keys: z.object({
    p256dh: z.string().regex(/^[A-Za-z0-9_-]{80,100}=*$/, "Not a P-256 public key"),
    auth: z.string().regex(/^[A-Za-z0-9_-]{16,32}=*$/, "Not an auth secret"),
  }),
  expirationTime: z.number().nullable().optional(),
  label: z.string().trim().max(80).optional(),
});

export const unsubscribeSchema = z.object({ endpoint: z.url().max(2000) });

export const notificationPatchSchema = z.object({ read: z.boolean() });

export type AlertPreferencesInput = z.infer<typeof alertPreferencesSchema>;
export type PushSubscriptionInput = z.infer<typeof pushSubscriptionSchema>;
