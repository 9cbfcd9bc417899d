import type { Role, SheetStatus } from "@/db/schema";

/**
 * The review workflow of a sheet revision, written once. Every server action, API
 * route and test asks `transitionAllowed`; nothing else decides.
 *
 *   draft ──submit──▶ in_review ──approve──▶ approved ──(new revision approved)──▶ superseded
 *     ▲                  │  │
 *     └────withdraw──────┘  └──return──▶ returned ──submit──▶ in_review
 *
 * Editing a draft or returned revision keeps it as it is (returned becomes draft);
 * editing an approved revision starts a new draft revision.
 */
export const TRANSITIONS = {
  submit: { from: ["draft", "returned"], to: "in_review", roles: ["engineer", "lead"], byAuthorOnly: false, notAuthor: false, needsComment: false },
  withdraw: { from: ["in_review"], to: "draft", roles: ["engineer", "lead"], byAuthorOnly: true, notAuthor: false, needsComment: false },
  approve: { from: ["in_review"], to: "approved", roles: ["lead"], byAuthorOnly: false, notAuthor: true, needsComment: false },
  return: { from: ["in_review"], to: "returned", roles: ["lead"], byAuthorOnly: false, notAuthor: true, needsComment: true },
} as const satisfies Record<
  string,
  { from: readonly SheetStatus[]; to: SheetStatus; roles: readonly Role[]; byAuthorOnly: boolean; notAuthor: boolean; needsComment: boolean }
>;

export type TransitionName = keyof typeof TRANSITIONS;
export const TRANSITION_NAMES = Object.keys(TRANSITIONS) as TransitionName[];

export type TransitionCheck = { ok: true; to: SheetStatus } | { ok: false; reason: string };

export function transitionAllowed(
  name: TransitionName,
  ctx: { status: SheetStatus; role: Role; actorId: number; authorId: number; comment?: string | null },
): TransitionCheck {
  const t = TRANSITIONS[name];
  if (!(t.roles as readonly Role[]).includes(ctx.role)) return { ok: false, reason: `Your role (${ctx.role}) cannot ${name} a sheet` };
  if (!(t.from as readonly SheetStatus[]).includes(ctx.status))
    return { ok: false, reason: `A revision that is ${ctx.status.replace("_", " ")} cannot be ${pastTense(name)}` };
  if (t.byAuthorOnly && ctx.actorId !== ctx.authorId) return { ok: false, reason: `Only the author can ${name} this revision` };
  if (t.notAuthor && ctx.actorId === ctx.authorId) return { ok: false, reason: "A lead cannot check and approve their own sheet: another lead must do it" };
  if (t.needsComment && !ctx.comment?.trim()) return { ok: false, reason: "Say what needs changing: a comment is required to return a sheet" };
  return { ok: true, to: t.to };
}

function pastTense(name: TransitionName): string {
  return { submit: "submitted", withdraw: "withdrawn", approve: "approved", return: "returned" }[name];
}

/** Statuses whose inputs may be edited in place; an approved revision is locked. */
export const EDITABLE_STATUSES: readonly SheetStatus[] = ["draft", "returned"];

/** Outcome of `editAllowed`: how a save applies, or why it is refused ("status" → 409, "author" → 403). */
export type EditCheck = { ok: true; mode: "in_place" | "new_revision" } | { ok: false; reason: string; kind: "status" | "author" };

/**
 * What saving new inputs does to the latest revision (role checks stay with `can(role,
 * "sheet.write")`): a draft or returned revision is edited in place, by its author only
 * (so a lead can never approve inputs they wrote into someone else's revision); an
 * approved revision stays locked and the save starts a new draft revision whose author
 * is the editor; a revision in review must be withdrawn first.
 */
export function editAllowed(ctx: { status: SheetStatus; actorId: number; authorId: number }): EditCheck {
  if (ctx.status === "in_review") return { ok: false, kind: "status", reason: "This revision is in review; withdraw it before editing" };
  if (ctx.status === "approved" || ctx.status === "superseded") return { ok: true, mode: "new_revision" };
  if (ctx.actorId !== ctx.authorId)
    return { ok: false, kind: "author", reason: "Only the author of this revision can edit it; ask them to make the change or to submit it for review" };
  return { ok: true, mode: "in_place" };
}
