import { z } from "zod";
import { ROLES } from "@/lib/auth/roles";
import {
  acceptInvitationSchema,
  invitationSchema,
  memberRoleSchema,
  resetConfirmSchema,
  resetRequestSchema,
} from "@/lib/validation/auth";
import type { Operation } from "../types";

const farmOfUser = z.object({ id: z.uuid(), name: z.string(), timeZone: z.string(), role: z.enum(ROLES) });
const member = z.object({ userId: z.uuid(), email: z.string(), name: z.string(), role: z.enum(ROLES), joinedAt: z.string() });
const invitation = z.object({ id: z.uuid(), farmId: z.uuid(), farmName: z.string(), email: z.string(), role: z.enum(ROLES), expiresAt: z.string(), acceptedAt: z.string().nullable() });

export const operations: Operation[] = [
  { method: "get", path: "/api/health", summary: "The app answers and its database is reachable", tag: "Service", access: "public" },
  { method: "get", path: "/api/v1/openapi.json", summary: "This document", tag: "Service", access: "public" },
  { method: "get", path: "/api/v1/me", summary: "The signed-in person and their farms", tag: "People", access: "user" },
  {
    method: "patch",
    path: "/api/v1/me",
    summary: "Change one's name or unit system",
    tag: "People",
    access: "user",
    body: z.object({ name: z.string().optional(), unitSystem: z.enum(["metric", "imperial"]).optional() }),
  },
  { method: "get", path: "/api/v1/farms", summary: "Farms of the signed-in person, with roles", tag: "Farms", access: "user", response: z.object({ data: z.array(farmOfUser) }) },
  { method: "get", path: "/api/v1/farms/{farmId}", summary: "One farm's settings", tag: "Farms", access: "view" },
  { method: "get", path: "/api/v1/farms/{farmId}/members", summary: "Members and roles", tag: "People", access: "manageMembers", response: z.object({ data: z.array(member) }) },
  { method: "patch", path: "/api/v1/farms/{farmId}/members/{userId}", summary: "Change a member's role", tag: "People", access: "manageMembers", body: memberRoleSchema },
  { method: "delete", path: "/api/v1/farms/{farmId}/members/{userId}", summary: "Remove a member", tag: "People", access: "manageMembers", status: 204 },
  { method: "get", path: "/api/v1/farms/{farmId}/invitations", summary: "Open invitations", tag: "People", access: "manageMembers", response: z.object({ data: z.array(invitation) }) },
  { method: "post", path: "/api/v1/farms/{farmId}/invitations", summary: "Invite someone by e-mail", tag: "People", access: "manageMembers", body: invitationSchema, status: 201 },
  { method: "delete", path: "/api/v1/farms/{farmId}/invitations/{invitationId}", summary: "Withdraw an invitation", tag: "People", access: "manageMembers", status: 204 },
  { method: "post", path: "/api/v1/invitations/accept", summary: "Accept an invitation", tag: "People", access: "public", body: acceptInvitationSchema },
  { method: "post", path: "/api/v1/password-resets", summary: "E-mail a password reset link", tag: "People", access: "public", body: resetRequestSchema, status: 202 },
  { method: "post", path: "/api/v1/password-resets/confirm", summary: "Set a new password with the e-mailed token", tag: "People", access: "public", body: resetConfirmSchema, status: 204 },
];
