/** The roles, in a module with no ORM import, so browser code can use the list without pulling in Drizzle. */
export const roles = ["shifter", "observer", "coordinator", "admin"] as const;
export type Role = (typeof roles)[number];
