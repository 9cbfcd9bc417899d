import { z } from "zod";
import type { Role } from "@/db/schema";
import { choice } from "@/lib/engine/core/schema";

/** Role values for forms; kept here so the browser bundle does not load the database schema. */
export const ROLE_OPTIONS = ["admin", "lead", "engineer", "viewer"] as const satisfies readonly Role[];
// Fails to compile if a role is added to the schema but not here.
const _allRoles: Exclude<Role, (typeof ROLE_OPTIONS)[number]> extends never ? true : never = true;
void _allRoles;

const id = (label: string) => z.coerce.number({ error: `${label} must be a number` }).int(`${label} must be a whole number`).positive(`${label} must be positive`);

export const inviteSchema = z.object({
  email: z
    .string()
    .trim()
    .toLowerCase()
    .min(1, "E-mail is required")
    .max(254, "E-mail must be at most 254 characters")
    .pipe(z.email("E-mail must be an address like name@company.example")),
  role: choice("Role", ROLE_OPTIONS),
});
export type InviteInput = z.input<typeof inviteSchema>;

export const changeRoleSchema = z.object({ userId: id("User"), role: choice("Role", ROLE_OPTIONS) });
export const setStatusSchema = z.object({ userId: id("User"), status: choice("Status", ["active", "deactivated"] as const) });
export const revokeSchema = z.object({ invitationId: id("Invitation") });
