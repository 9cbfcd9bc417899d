import { z } from "zod";
import { choice } from "@/lib/engine/core/schema";

import { ROLE_OPTIONS } from "./role-options";

export { ROLE_OPTIONS };

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
