/** The demo's invented people and who they are on which farm (DESIGN.md "Roles": roles are per farm). */

export type Role = "owner" | "manager" | "agronomist" | "worker" | "viewer";

export interface Person {
  key: string;
  email: string;
  name: string;
}

/** Everyone signs in with this password; the demo is for looking around, not for keeping secrets. */
export const DEMO_PASSWORD = "rootbank-demo";

export const PEOPLE: Person[] = [
  { key: "owner", email: "owner@kestrelbend.example", name: "Rosalind Tarrant" },
  { key: "manager", email: "manager@kestrelbend.example", name: "Declan Mawby" },
  { key: "agronomist", email: "agronomist@kestrelbend.example", name: "Priya Halloran" },
  { key: "worker", email: "worker@kestrelbend.example", name: "Tomasz Birrell" },
  { key: "viewer", email: "viewer@kestrelbend.example", name: "Hazel Quinlan" },
  // Ibis Flat needs an owner of its own, so the Kestrel Bend people can hold lesser roles there.
  { key: "ibis-owner", email: "owner@ibisflat.example", name: "Colin Ashdown" },
];

/** Farm key -> person key -> role. */
export const MEMBERSHIPS: Record<string, Record<string, Role>> = {
  "kestrel-bend": {
    owner: "owner",
    manager: "manager",
    agronomist: "agronomist",
    worker: "worker",
    viewer: "viewer",
  },
  "ibis-flat": {
    "ibis-owner": "owner",
    agronomist: "agronomist", // the same adviser on both farms
    manager: "viewer", // a neighbour who may look, not touch
  },
};
