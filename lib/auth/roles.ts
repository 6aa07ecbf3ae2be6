/**
 * Who may do what on a farm. Roles are per farm; capabilities are what route handlers, server actions
 * and pages ask for. This module is pure so the client can use it to hide buttons, but only the server's
 * check counts.
 */
export const ROLES = ["owner", "manager", "agronomist", "worker", "viewer"] as const;
export type Role = (typeof ROLES)[number];

export const CAPABILITIES = {
  /** See the map, fields and accounts. */
  view: ["owner", "manager", "agronomist", "worker", "viewer"],
  /** Log rain, irrigation and soil checks. */
  log: ["owner", "manager", "agronomist", "worker"],
  /** Edit fields, gauges, stations and irrigation systems. */
  editSetup: ["owner", "manager"],
  /** Edit soils, crops, crop coefficients, plantings and triggers. */
  editAgronomy: ["owner", "manager", "agronomist"],
  /** Read the season statement. */
  readStatement: ["owner", "manager", "agronomist", "viewer"],
  /** Change the licence or allocation. */
  editAllocation: ["owner", "manager"],
  /** Members, invitations and API tokens (managers may only handle workers). */
  manageMembers: ["owner", "manager"],
} as const satisfies Record<string, readonly Role[]>;

export type Capability = keyof typeof CAPABILITIES;

export function can(role: Role | null | undefined, capability: Capability): boolean {
  return role != null && (CAPABILITIES[capability] as readonly Role[]).includes(role);
}

/** Which roles a member with `role` may give or take away: owners any, managers only workers. */
export function assignableRoles(role: Role): readonly Role[] {
  if (role === "owner") return ROLES;
  if (role === "manager") return ["worker"];
  return [];
}

export const ROLE_LABELS: Record<Role, string> = {
  owner: "Owner",
  manager: "Farm manager",
  agronomist: "Agronomist",
  worker: "Field worker",
  viewer: "Viewer",
};
