"use client";

import useSWR from "swr";
import type { Role } from "@/lib/auth/roles";
import { fetchJson } from "./fetcher";

export interface MemberDto {
  userId: string;
  email: string;
  name: string;
  role: Role;
  joinedAt: string;
}

export interface InvitationDto {
  id: string;
  email: string;
  role: Role;
  expiresAt: string;
}

export function useMembers(farmId: string) {
  return useSWR<{ data: MemberDto[] }>(`/api/v1/farms/${farmId}/members`, fetchJson);
}

export function useInvitations(farmId: string) {
  return useSWR<{ data: InvitationDto[] }>(`/api/v1/farms/${farmId}/invitations`, fetchJson);
}
