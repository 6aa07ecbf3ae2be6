import "server-only";
import { getServerSession } from "next-auth";
import { getToken } from "next-auth/jwt";
import { forbidden, notFound, redirect } from "next/navigation";
import { getRole } from "@/db/memberships";
import { getUser, type User } from "@/db/users";
import { AppError } from "@/lib/api/errors";
import { env } from "@/lib/env";
import { authOptions } from "./options";
import { can, type Capability, type Role } from "./roles";

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

export function isUuid(value: string): boolean {
  return UUID.test(value);
}

/** The signed-in user of an API request (from the session cookie), or a 401. */
export async function requireApiUser(req: Request): Promise<User> {
  const token = await getToken({
    req: req as unknown as Parameters<typeof getToken>[0]["req"],
    secret: env().NEXTAUTH_SECRET,
  });
  const user = token?.sub ? await getUser(token.sub) : undefined;
  if (!user) throw new AppError("unauthenticated", "Sign in to continue.");
  return user;
}

/**
 * The one server-side check of a farm role. A person who is not a member of the farm gets a 404, so
 * guessed ids reveal nothing; a member without the capability gets a 403.
 */
export async function requireFarmCapability(userId: string, farmId: string, capability: Capability): Promise<Role> {
  const role = isUuid(farmId) ? await getRole(userId, farmId) : undefined;
  if (!role) throw new AppError("not_found", "No such farm.");
  if (!can(role, capability)) {
    throw new AppError("forbidden", "Your role on this farm does not allow this.");
  }
  return role;
}

/** The signed-in user of a page or server action; pages send everyone else to sign in. */
export async function currentUser(): Promise<User | undefined> {
  const session = await getServerSession(authOptions);
  return session?.user?.id ? getUser(session.user.id) : undefined;
}

export async function requirePageUser(): Promise<User> {
  const user = await currentUser();
  if (!user) redirect("/sign-in");
  return user;
}

/** The same check as requireFarmCapability, for pages: 404 for strangers, 403 for the wrong role. */
export async function requireFarmPage(farmId: string, capability: Capability): Promise<{ user: User; role: Role }> {
  const user = await requirePageUser();
  const role = isUuid(farmId) ? await getRole(user.id, farmId) : undefined;
  if (!role) notFound();
  if (!can(role, capability)) forbidden();
  return { user, role };
}
