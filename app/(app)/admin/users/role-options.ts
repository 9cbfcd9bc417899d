import type { Role } from "@/db/schema";

/**
 * Role values for forms; kept apart from the schemas so the browser bundle of the users
 * page loads neither the database schema nor zod to draw its role pickers.
 */
export const ROLE_OPTIONS = ["admin", "lead", "engineer", "viewer"] as const satisfies readonly Role[];
// Fails to compile if a role is added to the schema but not here.
const _allRoles: Exclude<Role, (typeof ROLE_OPTIONS)[number]> extends never ? true : never = true;
void _allRoles;
