import { z } from "zod";
import { listFarmsOfUser } from "@/db/memberships";
import { updateUserProfile } from "@/db/users";
import { readJson, withUser } from "@/lib/api/handler";

const profileSchema = z.object({
  name: z.string().trim().min(1).max(120).optional(),
  unitSystem: z.enum(["metric", "imperial"]).optional(),
});

// GET /api/v1/me — the signed-in person and their farms with roles
export const GET = withUser(async ({ user }) => ({ user, farms: await listFarmsOfUser(user.id) }));

// PATCH /api/v1/me — change one's name or unit system
export const PATCH = withUser(async ({ req, user }) => {
  const patch = await readJson(req, profileSchema);
  return { user: await updateUserProfile(user.id, patch) };
});
