import type { Role } from "@/db/schema/roles";

export { roles, type Role } from "@/db/schema/roles";

/** The signed-in person as every guard and domain function sees them. */
export interface SessionUser {
  id: string;
  email: string;
  name: string;
  role: Role;
  timeZone: string;
  initials: string;
}

/** The session view of a stored person (a users row, or anything with its fields). */
export function toSessionUser(row: SessionUser): SessionUser {
  return { id: row.id, email: row.email, name: row.name, role: row.role, timeZone: row.timeZone, initials: row.initials };
}

/** Who may do what, named once so routes and pages read the same list. */
export const can = {
  triage: ["shifter", "coordinator"],
  planFollowUp: ["shifter", "coordinator"],
  /** pointing plans: shifters and coordinators for any site, observers for their own sites' instruments (checked in the service) */
  planPointings: ["shifter", "observer", "coordinator"],
  claimTask: ["observer", "coordinator"],
  /** tick a planned pointing done: observers at the plan's site or holding its task, coordinators anywhere */
  tickPointings: ["observer", "coordinator"],
  /** log exposures (observers only for tasks they hold or their sites' instruments, checked by the service) */
  recordObservations: ["shifter", "observer", "coordinator"],
  /** report a transient found in follow-up */
  reportCounterparts: ["shifter", "observer", "coordinator"],
  manageRota: ["coordinator", "admin"],
  manageUsers: ["coordinator", "admin"],
  manageSites: ["coordinator", "admin"],
  manageSettings: ["coordinator", "admin"],
  /** see refused feed posts and failed pages */
  readDeliveryFailures: ["coordinator", "admin"],
  /** send a failed page again (a write, so named apart from reading the failures) */
  retryPages: ["coordinator", "admin"],
  uploadSkymap: ["shifter", "coordinator"],
  /** split a trigger out of its candidate, merge two candidates */
  regroupTriggers: ["coordinator"],
  /** upload, rename, make default and delete galaxy catalogues */
  manageCatalogues: ["coordinator"],
  read: ["shifter", "observer", "coordinator", "admin"],
} as const satisfies Record<string, readonly Role[]>;

export function hasRole(user: Pick<SessionUser, "role">, allowed: readonly Role[]): boolean {
  return allowed.includes(user.role);
}

export const roleLabels: Record<Role, string> = {
  shifter: "Shifter",
  observer: "Observer",
  coordinator: "Coordinator",
  admin: "Administrator",
};
