import type { Role } from "@/db/schema";

/**
 * What each role may do, written once. Pages, actions and handlers ask `can(role, …)`
 * through the guard; nothing else decides.
 */
export const PERMISSIONS = {
  "organisation.manage": ["admin"],
  "users.manage": ["admin"],
  "mailbox.read": ["admin"],
  "project.read": ["admin", "lead", "engineer", "viewer"],
  "project.write": ["admin", "lead", "engineer"],
  "project.archive": ["admin", "lead"],
  "sheet.read": ["admin", "lead", "engineer", "viewer"],
  "sheet.write": ["lead", "engineer"],
  "sheet.submit": ["lead", "engineer"],
  "sheet.review": ["lead"],
  "token.manage": ["admin", "lead", "engineer", "viewer"],
  "schedule.read": ["admin", "lead", "engineer", "viewer"],
  "schedule.upload": ["lead", "engineer"],
  "ampacity.read": ["admin", "lead", "engineer", "viewer"],
  "ampacity.manage": ["admin"],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSIONS;

export function can(role: Role, permission: Permission): boolean {
  return (PERMISSIONS[permission] as readonly Role[]).includes(role);
}

export const ROLE_LABELS: Record<Role, string> = {
  admin: "Administrator",
  lead: "Lead engineer",
  engineer: "Engineer",
  viewer: "Viewer",
};
