import type { Capability } from "@/lib/auth/roles";

/** Who may call a route: anyone, any signed-in person, or members whose role has the capability. */
export type Access = "public" | "user" | Capability;

/** Keys are "METHOD /path" with the route folder's own [segment] names. */
export type AccessTable = Record<string, Access>;
