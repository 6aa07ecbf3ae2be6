import "server-only";
import type { Knex } from "knex";
import type { Role } from "@/lib/auth/roles";
import { db } from "./knex";

export interface Invitation {
  id: string;
  farmId: string;
  farmName: string;
  email: string;
  role: Role;
  expiresAt: string;
  acceptedAt: string | null;
}

interface InvitationRow {
  id: string;
  farm_id: string;
  farm_name: string;
  email: string;
  role: Role;
  expires_at: Date;
  accepted_at: Date | null;
}

function toInvitation(r: InvitationRow): Invitation {
  return {
    id: r.id,
    farmId: r.farm_id,
    farmName: r.farm_name,
    email: r.email,
    role: r.role,
    expiresAt: new Date(r.expires_at).toISOString(),
    acceptedAt: r.accepted_at ? new Date(r.accepted_at).toISOString() : null,
  };
}

const base = () =>
  db("invitations as i")
    .join("farms as f", "f.id", "i.farm_id")
    .select("i.id", "i.farm_id", "f.name as farm_name", "i.email", "i.role", "i.expires_at", "i.accepted_at");

export async function createInvitation(input: {
  farmId: string;
  email: string;
  role: Role;
  tokenHash: string;
  invitedBy: string;
  ttlHours: number;
}): Promise<Invitation> {
  const [row] = await db("invitations")
    .insert({
      farm_id: input.farmId,
      email: input.email,
      role: input.role,
      token_hash: input.tokenHash,
      invited_by: input.invitedBy,
      expires_at: db.raw(`now() + make_interval(hours => ?)`, [input.ttlHours]),
    })
    .returning("id");
  return (await getInvitation(row.id))!;
}

export async function getInvitation(id: string): Promise<Invitation | undefined> {
  const row = await base().where("i.id", id).first();
  return row ? toInvitation(row) : undefined;
}

export async function findOpenInvitationByTokenHash(tokenHash: string): Promise<Invitation | undefined> {
  const row = await base()
    .where("i.token_hash", tokenHash)
    .whereNull("i.accepted_at")
    .where("i.expires_at", ">", db.fn.now())
    .first();
  return row ? toInvitation(row) : undefined;
}

export async function listOpenInvitations(farmId: string): Promise<Invitation[]> {
  const rows = await base()
    .where("i.farm_id", farmId)
    .whereNull("i.accepted_at")
    .where("i.expires_at", ">", db.fn.now())
    .orderBy("i.created_at", "desc");
  return rows.map(toInvitation);
}

export async function markInvitationAccepted(id: string, trx: Knex = db): Promise<boolean> {
  const n = await trx("invitations").where({ id }).whereNull("accepted_at").update({ accepted_at: db.fn.now() });
  return n === 1;
}

export async function revokeInvitation(farmId: string, id: string): Promise<number> {
  return db("invitations").where({ id, farm_id: farmId }).whereNull("accepted_at").delete();
}
