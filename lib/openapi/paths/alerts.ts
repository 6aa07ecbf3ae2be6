import { z } from "zod";
import { ALERT_KINDS } from "@/lib/alerts/rules";
import { alertPreferencesSchema, alertRuleSchema, alertSettingsSchema, notificationPatchSchema, pushSubscriptionSchema, unsubscribeSchema } from "@/lib/validation/alerts";
import type { Operation } from "../types";

const notification = z.object({
  id: z.uuid(),
  farmId: z.uuid(),
  kind: z.enum(ALERT_KINDS),
  fieldId: z.uuid().nullable(),
  localDate: z.string(),
  title: z.string(),
  body: z.string(),
  url: z.string(),
  createdAt: z.string(),
  readAt: z.string().nullable(),
});
const page = z.object({ limit: z.number(), offset: z.number(), total: z.number(), nextOffset: z.number().nullable() });
const delivery = z.object({
  id: z.string(),
  notificationId: z.uuid(),
  userId: z.uuid(),
  userName: z.string(),
  kind: z.enum(ALERT_KINDS),
  title: z.string(),
  channel: z.enum(["push", "email", "digest"]),
  target: z.string(),
  status: z.enum(["pending", "sent", "failed", "gone"]),
  attempts: z.number(),
  dueAt: z.string(),
  sentAt: z.string().nullable(),
  lastError: z.string().nullable(),
});
const device = z.object({ id: z.uuid(), label: z.string().nullable(), service: z.string(), createdAt: z.string(), lastSentAt: z.string().nullable() });
const preferences = z.object({ rules: z.array(alertRuleSchema), settings: alertSettingsSchema });
const listQuery = z.object({ limit: z.number().int().optional(), offset: z.number().int().optional(), unread: z.enum(["true", "false"]).optional() });

export const operations: Operation[] = [
  { method: "get", path: "/api/v1/farms/{farmId}/alerts", summary: "My alert rules and settings on this farm", tag: "Alerts", access: "view", response: preferences },
  { method: "put", path: "/api/v1/farms/{farmId}/alerts", summary: "Change my alert rules, quiet hours and digest mode", tag: "Alerts", access: "view", body: alertPreferencesSchema, response: preferences },
  { method: "post", path: "/api/v1/farms/{farmId}/alerts/check", summary: "Evaluate the farm's alert conditions now", tag: "Alerts", access: "editSetup" },
  {
    method: "get",
    path: "/api/v1/farms/{farmId}/alerts/deliveries",
    summary: "Sent log: each push and e-mail, to whom, and how it ended",
    tag: "Alerts",
    access: "manageMembers",
    query: listQuery.omit({ unread: true }),
    response: z.object({ data: z.array(delivery), page }),
  },
  {
    method: "get",
    path: "/api/v1/farms/{farmId}/notifications",
    summary: "My alerts on this farm with the unread count",
    tag: "Alerts",
    access: "view",
    query: listQuery,
    response: z.object({ data: z.array(notification), page, unread: z.number() }),
  },
  { method: "patch", path: "/api/v1/farms/{farmId}/notifications/{notificationId}", summary: "Mark an alert read or unread", tag: "Alerts", access: "view", body: notificationPatchSchema, response: notification },
  { method: "post", path: "/api/v1/farms/{farmId}/notifications/read-all", summary: "Mark all my alerts read", tag: "Alerts", access: "view", response: z.object({ marked: z.number() }) },
  { method: "get", path: "/api/v1/push/public-key", summary: "The VAPID public key for subscribing a device", tag: "Alerts", access: "public", response: z.object({ publicKey: z.string() }) },
  { method: "get", path: "/api/v1/push/subscriptions", summary: "My devices that receive pushes", tag: "Alerts", access: "user", response: z.object({ data: z.array(device) }) },
  { method: "post", path: "/api/v1/push/subscriptions", summary: "Subscribe this device to push alerts", tag: "Alerts", access: "user", body: pushSubscriptionSchema, status: 201, response: device },
  { method: "delete", path: "/api/v1/push/subscriptions", summary: "Unsubscribe a device by its endpoint", tag: "Alerts", access: "user", body: unsubscribeSchema, status: 204 },
];
