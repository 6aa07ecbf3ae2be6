import "server-only";
import bcrypt from "bcryptjs";
import { audit } from "@/db/audit";
import { getFarm } from "@/db/farms";
import {
  createInvitation,
  findOpenInvitationByTokenHash,
  markInvitationAccepted,
  type Invitation,
} from "@/db/invitations";
import { db } from "@/db/knex";
import { getRole, upsertMembership } from "@/db/memberships";
import { findCredentials, findOrCreateUser, setPasswordHash, type User } from "@/db/users";
import { AppError } from "@/lib/api/errors";
import { env } from "@/lib/env";
import { sendMail } from "@/lib/mail/send";
import { invitationMail } from "@/lib/mail/templates";
import type { InvitationInput } from "@/lib/validation/auth";
import { assignableRoles, type Role } from "./roles";
import { hashToken, newToken } from "./tokens";

const INVITATION_TTL_HOURS = 7 * 24;

/** Invites someone to a farm by e-mail. Owners may invite any role, managers only workers. */
export async function inviteMember(farmId: string, inviter: User, inviterRole: Role, input: InvitationInput): Promise<Invitation> {
  if (!assignableRoles(inviterRole).includes(input.role)) {
    throw new AppError("forbidden", `As ${inviterRole} you cannot invite a ${input.role}.`, { role: "Not allowed for your role" });
  }
  const farm = await getFarm(farmId);
  if (!farm) throw new AppError("not_found", "No such farm.");
  const { token, hash } = newToken();
  const invitation = await createInvitation({
    farmId,
    email: input.email,
    role: input.role,
    tokenHash: hash,
    invitedBy: inviter.id,
    ttlHours: INVITATION_TTL_HOURS,
  });
  await audit({ farmId, userId: inviter.id, action: "create", entity: "invitation", entityId: invitation.id, after: { email: input.email, role: input.role } });
  const link = `${env().NEXTAUTH_URL}/invite/${token}`;
  await sendMail(invitationMail(input.email, farm.name, input.role, inviter.name, link));
  return invitation;
}

export async function findInvitationByToken(token: string): Promise<Invitation | undefined> {
  return findOpenInvitationByTokenHash(hashToken(token));
}

/**
 * Accepts an invitation: the person gets the role and, when they had no password yet, the one they chose.
 * Someone who already has an account keeps their password and signs in with it.
 */
export async function acceptInvitation(
  token: string,
  name: string,
  password: string,
): Promise<{ farmId: string; email: string; passwordSet: boolean }> {
  const invitation = await findInvitationByToken(token);
  if (!invitation) throw new AppError("gone", "This invitation link has expired or was already used. Ask for a new one.");
  const user = (await findCredentials(invitation.email)) ?? { user: await findOrCreateUser(invitation.email, name), passwordHash: null };
  const existing = await getRole(user.user.id, invitation.farmId);
  const passwordHash = user.passwordHash ? null : await bcrypt.hash(password, 10);
  await db.transaction(async (trx) => {
    if (!(await markInvitationAccepted(invitation.id, trx))) {
      throw new AppError("gone", "This invitation was already used.");
    }
    if (passwordHash) await setPasswordHash(user.user.id, passwordHash, trx);
    // Accepting never lowers a role the person already holds on this farm.
    if (!existing) await upsertMembership(invitation.farmId, user.user.id, invitation.role, user.user.id, trx);
    await audit(
      { farmId: invitation.farmId, userId: user.user.id, action: "accept", entity: "invitation", entityId: invitation.id, after: { role: existing ?? invitation.role } },
      trx,
    );
  });
  return { farmId: invitation.farmId, email: user.user.email, passwordSet: passwordHash !== null };
}
