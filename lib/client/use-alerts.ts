"use client";

import useSWR from "swr";
import { fetchJson } from "@/lib/client/fetcher";
import type { AlertKind, AlertRule } from "@/lib/alerts/rules";

/** SWR hooks for the alerts API; kept beside the alert components that alone use them. */

export interface NotificationDto {
  id: string;
  kind: AlertKind;
  fieldId: string | null;
  localDate: string;
  title: string;
  body: string;
  url: string;
  createdAt: string;
  readAt: string | null;
}

export interface NotificationsPage {
  data: NotificationDto[];
  page: { limit: number; offset: number; total: number; nextOffset: number | null };
  unread: number;
}

export interface AlertSettingsDto {
  quietStart: string | null;
  quietEnd: string | null;
  digestOnly: boolean;
  digestHour: number;
}

export interface AlertPreferencesDto {
  rules: AlertRule[];
  settings: AlertSettingsDto;
}

export interface DeliveryDto {
  id: string;
  userName: string;
  title: string;
  channel: "push" | "email" | "digest";
  target: string;
  status: "pending" | "sent" | "failed" | "gone";
  attempts: number;
  dueAt: string;
  sentAt: string | null;
  lastError: string | null;
}

export const notificationsKey = (farmId: string) => `/api/v1/farms/${farmId}/notifications?limit=50`;
/** The bell asks for unread ones only, once a minute, so an alert made by the worker shows without a reload. */
export const unreadKey = (farmId: string) => `/api/v1/farms/${farmId}/notifications?unread=true&limit=1`;

export function useNotifications(farmId: string) {
  return useSWR<NotificationsPage>(notificationsKey(farmId), fetchJson, { refreshInterval: 60_000 });
}

export function useUnreadCount(farmId: string) {
  return useSWR<NotificationsPage>(unreadKey(farmId), fetchJson, { refreshInterval: 60_000 });
}

export function useAlertPreferences(farmId: string) {
  return useSWR<AlertPreferencesDto>(`/api/v1/farms/${farmId}/alerts`, fetchJson);
}

export function useDeliveryLog(farmId: string, enabled: boolean) {
  return useSWR<{ data: DeliveryDto[] }>(enabled ? `/api/v1/farms/${farmId}/alerts/deliveries?limit=30` : null, fetchJson);
}
