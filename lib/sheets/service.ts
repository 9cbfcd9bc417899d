import "server-only";
import { z } from "zod";
import { db, type Tx } from "@/db/client";
import type { AuditEvent, SheetStatus } from "@/db/schema";
import {
  bumpSheetVersion,
  findProject,
  findSheet,
  insertRevision,
  insertSheet,
  lockLatestRevision,
  lockOtherApprovedRevisions,
  nextSheetPosition,
  revisionSchemeOf,
  updateRevision,
  updateSheetTitle,
  type RevisionRow,
  type SheetProject,
  type SheetRow,
} from "@/db/queries/sheets";
import { audit } from "@/lib/audit";
import type { Actor } from "@/lib/auth/guard";
import type { Permission } from "@/lib/auth/roles";
import { ENGINE_VERSION, runCalc } from "@/lib/engine";
import type { CalcResult } from "@/lib/engine/core/result";
import { compactNetworkResult, type NetworkResults } from "@/lib/engine/network";
import { conflict, forbidden, isDuplicateKey, notFound, validationError } from "@/lib/errors";
import { canonicalJson, contentHash } from "@/lib/hash";
import { parseInput, PROJECT_NOT_FOUND, requirePermission, SHEET_NOT_FOUND, STALE_SHEET_MESSAGE } from "./common";
import { notifyApproved, notifyReturned, notifyReviewRequested, type SheetMailContext } from "./notifications";
import { revisionLabel } from "./revision-label";
import { createSheetSchema, idField, saveSheetSchema, transitionSheetSchema, versionField } from "./schemas";
import { editAllowed, TRANSITIONS, transitionAllowed, type TransitionName } from "./workflow";

/**
 * The write side of calculation sheets: create, save, and move through review. Each
 * function takes the acting user first, validates its input with zod, and does all its
 * writes (the change, the audit event, the outbox mail) in one transaction.
 *
 * Results are always computed here on the server with `runCalc`. A draft may hold
 * inputs that do not validate yet: they are stored as typed, the results are null and
 * the field errors come back (`inputErrors`) for the form to show. Submitting re-runs
 * the calculation and refuses while any input is invalid.
 */

/** One import point for callers: the messages callers may match, and the read functions. */
export { STALE_SHEET_MESSAGE, SHEET_NOT_FOUND } from "./common";
export * from "./reads";

/** A revision as the write functions report it. */
export interface RevisionRef {
  id: number;
  ordinal: number;
  label: string;
  status: SheetStatus;
}

/** What `createSheet` and `saveSheet` return. */
export interface SheetWriteResult {
  sheetId: number;
  projectId: number;
  /** The sheet's new version: send it with the next save or transition. */
  version: number;
  /** The latest revision after the write. */
  revision: RevisionRef;
  /** True when the save started a new revision (the latest one was approved). */
  newRevision: boolean;
  /** The stored calculation result, or null while the inputs are invalid. */
  results: Record<string, unknown> | null;
  /** Field errors of the inputs ("losses.0.loss_W": message), or null when they are valid. */
  inputErrors: Record<string, string> | null;
}

/** What `transitionSheet` returns. */
export interface TransitionResult {
  sheetId: number;
  projectId: number;
  version: number;
  revision: RevisionRef;
  /** Labels of revisions this approval superseded. */
  superseded: string[];
  /** Addresses the transition's e-mails were queued for. */
  notified: string[];
}

/** JSON round trip: what the database will hand back, so hashes match the stored bytes. */
function asStoredJson<T>(v: T): T {
  return JSON.parse(JSON.stringify(v)) as T;
}

interface Computed {
  results: Record<string, unknown> | null;
  engineVersion: string;
  contentHash: string;
  inputErrors: Record<string, string> | null;
}

/**
 * The result as stored: a large bus network keeps its per-segment values as columns
 * (`compactNetworkResult`), so storing, hashing and reading it back stay within a
 * second or two; every other result is stored as computed.
 */
function storable(kind: string, result: CalcResult<unknown>): CalcResult<unknown> {
  return kind === "bus-network" ? compactNetworkResult(result as CalcResult<NetworkResults>) : result;
}

/** Runs the calculation and hashes inputs + results + engine version. */
function compute(kind: string, inputs: Record<string, unknown>): Computed {
  const outcome = runCalc(kind, inputs);
  const results = outcome.ok ? asStoredJson(storable(kind, outcome.result) as unknown as Record<string, unknown>) : null;
  return {
    results,
    engineVersion: ENGINE_VERSION,
    contentHash: contentHash(inputs, results, ENGINE_VERSION),
    inputErrors: outcome.ok ? null : outcome.fields,
  };
}

/** Applies the optimistic lock; tells a stale version (409) from an unknown sheet (404). */
async function lockVersion(tx: Tx, actor: Actor, sheetId: number, version: number): Promise<{ sheet: SheetRow; version: number }> {
  const next = await bumpSheetVersion(tx, actor.organisationId, sheetId, version);
  const sheet = await findSheet(tx, actor.organisationId, sheetId);
  if (!sheet) throw notFound(SHEET_NOT_FOUND);
  if (next === null) throw conflict(STALE_SHEET_MESSAGE);
  return { sheet, version: next };
}

async function latestOf(tx: Tx, actor: Actor, sheetId: number): Promise<RevisionRow> {
  const latest = await lockLatestRevision(tx, actor.organisationId, sheetId);
  if (!latest) throw new Error(`sheet ${sheetId} has no revision`);
  return latest;
}

async function projectOf(tx: Tx, actor: Actor, projectId: number): Promise<SheetProject> {
  const project = await findProject(tx, actor.organisationId, projectId);
  if (!project) throw notFound(PROJECT_NOT_FOUND);
  return project;
}

const ref = (r: { id: number; ordinal: number; label: string }, status: SheetStatus): RevisionRef => ({ id: r.id, ordinal: r.ordinal, label: r.label, status });

/**
 * Adds a sheet of a calculation kind to a project, with its first revision (ordinal 0,
 * labelled by the organisation's scheme) as a draft. Needs `sheet.write`.
 * Errors: 403 role; 400 field errors (unknown kind, tag already used in the project, …);
 * 404 project not in the actor's organisation; 409 project archived.
 */
export async function createSheet(actor: Actor, raw: unknown): Promise<SheetWriteResult> {
  requirePermission(actor, "sheet.write");
  const input = parseInput(createSheetSchema, raw);
  const inputs = asStoredJson(input.inputs);
  const c = compute(input.kind, inputs);
  try {
    return await db().transaction(async (tx) => {
      const project = await projectOf(tx, actor, input.projectId);
      if (project.archivedAt) throw conflict("This project is archived; restore it before adding sheets");
      const scheme = await revisionSchemeOf(tx, actor.organisationId);
      const position = await nextSheetPosition(tx, actor.organisationId, project.id);
      const sheetId = await insertSheet(tx, {
        organisationId: actor.organisationId,
        projectId: project.id,
        kind: input.kind,
        tag: input.tag,
        title: input.title,
        position,
        createdById: actor.id,
      });
      const label = revisionLabel(0, scheme);
      const revisionId = await insertRevision(tx, {
        organisationId: actor.organisationId,
        sheetId,
        ordinal: 0,
        label,
        inputs,
        results: c.results,
        engineVersion: c.engineVersion,
        contentHash: c.contentHash,
        authorId: actor.id,
      });
      await audit(tx, {
        organisationId: actor.organisationId,
        actorId: actor.id,
        event: "sheet.created",
        entityType: "sheet",
        entityId: sheetId,
        details: { projectId: project.id, kind: input.kind, tag: input.tag, title: input.title, revisionId, ordinal: 0, label, valid: c.inputErrors === null },
      });
      return {
        sheetId,
        projectId: project.id,
        version: 1,
        revision: { id: revisionId, ordinal: 0, label, status: "draft" },
        newRevision: false,
        results: c.results,
        inputErrors: c.inputErrors,
      };
    });
  } catch (err) {
    if (isDuplicateKey(err)) throw validationError({ tag: `Tag ${input.tag} is already used in this project` }, "Tag is already used in this project");
    throw err;
  }
}

/**
 * Saves new inputs (and optionally a new title) against the version the client opened.
 * A draft or returned revision is edited in place by its author (returned becomes
 * draft); an approved latest revision stays untouched and a new draft revision (next
 * ordinal and label, authored by the actor) is created, unless the inputs are
 * identical to it; a revision in review must be withdrawn first. Results, engine
 * version and content hash are recomputed. Needs `sheet.write`.
 * Errors: 403 role or not the author; 400 field errors of the request; 404 sheet not
 * in the organisation; 409 stale version (STALE_SHEET_MESSAGE) or revision in review.
 */
export async function saveSheet(actor: Actor, raw: unknown): Promise<SheetWriteResult> {
  requirePermission(actor, "sheet.write");
  const input = parseInput(saveSheetSchema, raw);
  const inputs = asStoredJson(input.inputs);
  return db().transaction(async (tx) => {
    const { sheet, version } = await lockVersion(tx, actor, input.sheetId, input.version);
    const latest = await latestOf(tx, actor, sheet.id);
    const edit = editAllowed({ status: latest.status, actorId: actor.id, authorId: latest.authorId });
    if (!edit.ok) throw edit.kind === "status" ? conflict(edit.reason) : forbidden(edit.reason);

    const titleChanged = input.title !== undefined && input.title !== sheet.title;
    if (titleChanged) await updateSheetTitle(tx, actor.organisationId, sheet.id, input.title!);
    const titleDetails = titleChanged ? { title: { from: sheet.title, to: input.title } } : {};
    const c = compute(sheet.kind, inputs);
    const base = { organisationId: actor.organisationId, actorId: actor.id, entityType: "sheet", entityId: sheet.id } as const;

    if (edit.mode === "in_place") {
      await updateRevision(tx, actor.organisationId, latest.id, {
        status: "draft",
        inputs,
        results: c.results,
        engineVersion: c.engineVersion,
        contentHash: c.contentHash,
      });
      await audit(tx, {
        ...base,
        event: "sheet.saved",
        details: { revisionId: latest.id, ordinal: latest.ordinal, label: latest.label, from: latest.status, valid: c.inputErrors === null, ...titleDetails },
      });
      return { sheetId: sheet.id, projectId: sheet.projectId, version, revision: ref(latest, "draft"), newRevision: false, results: c.results, inputErrors: c.inputErrors };
    }

    // The latest revision is approved (locked). Same inputs: nothing to revise.
    if (canonicalJson(inputs) === canonicalJson(latest.inputs)) {
      if (titleChanged) await audit(tx, { ...base, event: "sheet.saved", details: { revisionId: latest.id, label: latest.label, ...titleDetails } });
      const stored = compute(sheet.kind, latest.inputs);
      return {
        sheetId: sheet.id,
        projectId: sheet.projectId,
        version,
        revision: ref(latest, latest.status),
        newRevision: false,
        results: latest.results ?? null,
        inputErrors: stored.inputErrors,
      };
    }
    const scheme = await revisionSchemeOf(tx, actor.organisationId);
    const ordinal = latest.ordinal + 1;
    const label = revisionLabel(ordinal, scheme);
    const revisionId = await insertRevision(tx, {
      organisationId: actor.organisationId,
      sheetId: sheet.id,
      ordinal,
      label,
      inputs,
      results: c.results,
      engineVersion: c.engineVersion,
      contentHash: c.contentHash,
      authorId: actor.id,
    });
    await audit(tx, {
      ...base,
      event: "sheet.revised",
      details: { revisionId, ordinal, label, basedOn: { revisionId: latest.id, label: latest.label }, valid: c.inputErrors === null, ...titleDetails },
    });
    return {
      sheetId: sheet.id,
      projectId: sheet.projectId,
      version,
      revision: { id: revisionId, ordinal, label, status: "draft" },
      newRevision: true,
      results: c.results,
      inputErrors: c.inputErrors,
    };
  });
}

/** The permission each transition needs on top of the workflow's own rules. */
const TRANSITION_PERMISSION: Record<TransitionName, Permission> = {
  submit: "sheet.submit",
  withdraw: "sheet.submit",
  approve: "sheet.review",
  return: "sheet.review",
};

/**
 * Audit event per transition. The schema's event list has no "withdrawn" entry, so a
 * withdrawal is recorded as a save with `details.transition = "withdraw"`.
 */
const TRANSITION_EVENT: Record<TransitionName, AuditEvent> = {
  submit: "sheet.submitted",
  withdraw: "sheet.withdrawn",
  approve: "sheet.approved",
  return: "sheet.returned",
};

/**
 * Maps a refusal of `transitionAllowed` to the error vocabulary: the decision and its
 * message are the workflow's; this only picks the HTTP status (role or person → 403,
 * state → 409, missing comment → 400 on the comment field).
 */
function refusal(name: TransitionName, ctx: { status: SheetStatus; role: Actor["role"]; actorId: number; authorId: number }, reason: string) {
  const t = TRANSITIONS[name];
  if (!(t.roles as readonly string[]).includes(ctx.role)) return forbidden(reason);
  if (!(t.from as readonly SheetStatus[]).includes(ctx.status)) return conflict(reason);
  if ((t.byAuthorOnly && ctx.actorId !== ctx.authorId) || (t.notAuthor && ctx.actorId === ctx.authorId)) return forbidden(reason);
  return validationError({ comment: reason }, reason);
}

/**
 * Moves the sheet's latest revision through review: submit (draft/returned → in
 * review; inputs must be valid, results are recomputed), withdraw (author: in review →
 * draft), approve (another lead: in review → approved; the previously approved revision
 * becomes superseded), return (another lead, with a comment: in review → returned).
 * `transitionAllowed` decides; every transition bumps the sheet version, writes its
 * audit events and queues its e-mails (review requested → the organisation's other
 * active leads; approved/returned → the author) in one transaction.
 * Errors: 403 role, author-only or four-eyes; 400 invalid request, missing comment for
 * return, or invalid inputs on submit (field errors); 404 sheet not in the
 * organisation; 409 stale version or a state the transition cannot start from.
 */
export async function transitionSheet(actor: Actor, raw: unknown): Promise<TransitionResult> {
  const input = parseInput(transitionSheetSchema, raw);
  requirePermission(actor, TRANSITION_PERMISSION[input.transition]);
  return db().transaction(async (tx) => {
    const { sheet, version } = await lockVersion(tx, actor, input.sheetId, input.version);
    const latest = await latestOf(tx, actor, sheet.id);
    const ctx = { status: latest.status, role: actor.role, actorId: actor.id, authorId: latest.authorId };
    const check = transitionAllowed(input.transition, { ...ctx, comment: input.comment });
    if (!check.ok) throw refusal(input.transition, ctx, check.reason);

    const project = await projectOf(tx, actor, sheet.projectId);
    const now = new Date();
    const org = actor.organisationId;
    const mail: SheetMailContext = {
      organisationId: org,
      project: { id: project.id, name: project.name },
      sheet: { id: sheet.id, tag: sheet.tag, title: sheet.title },
      revisionLabel: latest.label,
      authorId: latest.authorId,
    };
    const details: Record<string, unknown> = {
      transition: input.transition,
      revisionId: latest.id,
      ordinal: latest.ordinal,
      label: latest.label,
      from: latest.status,
      to: check.to,
      ...(input.comment ? { comment: input.comment } : {}),
    };
    const superseded: Awaited<ReturnType<typeof lockOtherApprovedRevisions>> = [];
    let notified: string[] = [];

    switch (input.transition) {
      case "submit": {
        const c = compute(sheet.kind, latest.inputs);
        if (c.inputErrors) throw validationError(c.inputErrors, "Fix the inputs marked before submitting this sheet for review");
        await updateRevision(tx, org, latest.id, {
          status: check.to,
          results: c.results,
          engineVersion: c.engineVersion,
          contentHash: c.contentHash,
          submittedAt: now,
          checkedById: null,
          decidedAt: null,
        });
        details.contentHash = c.contentHash;
        notified = await notifyReviewRequested(tx, { ...mail, submitterName: actor.name });
        break;
      }
      case "withdraw":
        await updateRevision(tx, org, latest.id, { status: check.to, submittedAt: null });
        break;
      case "approve": {
        await updateRevision(tx, org, latest.id, {
          status: check.to,
          checkedById: actor.id,
          decidedAt: now,
          ...(input.comment ? { reviewComment: input.comment } : {}),
        });
        for (const old of await lockOtherApprovedRevisions(tx, org, sheet.id, latest.id)) {
          await updateRevision(tx, org, old.id, { status: "superseded" });
          superseded.push(old);
        }
        details.contentHash = latest.contentHash;
        notified = await notifyApproved(tx, { ...mail, approverName: actor.name });
        break;
      }
      case "return":
        await updateRevision(tx, org, latest.id, { status: check.to, checkedById: actor.id, decidedAt: now, reviewComment: input.comment });
        notified = await notifyReturned(tx, { ...mail, reviewerName: actor.name, comment: input.comment ?? "" });
        break;
    }
    if (superseded.length) details.superseded = superseded.map((r) => r.label);
    await audit(tx, { organisationId: org, actorId: actor.id, event: TRANSITION_EVENT[input.transition], entityType: "sheet", entityId: sheet.id, details });
    for (const old of superseded) {
      await audit(tx, {
        organisationId: org,
        actorId: actor.id,
        event: "sheet.superseded",
        entityType: "sheet",
        entityId: sheet.id,
        details: { revisionId: old.id, ordinal: old.ordinal, label: old.label, from: "approved", to: "superseded", supersededBy: { revisionId: latest.id, label: latest.label } },
      });
    }
    return {
      sheetId: sheet.id,
      projectId: sheet.projectId,
      version,
      revision: ref(latest, check.to),
      superseded: superseded.map((r) => r.label),
      notified,
    };
  });
}

/** What `importNetwork` stores about the file it was given. */
export interface NetworkImportSource {
  fileName: string;
  format: "csv" | "json";
  /** Size of the file, bytes. */
  bytes: number;
}

/** What `importNetwork` returns: the write, the network's size and the server's solve time. */
export interface NetworkImportResult extends SheetWriteResult {
  counts: { nodes: number; segments: number; loads: number; supplies: number };
  /** Wall time of the engine solve on the server, ms. */
  solveMs: number;
}

const importRequestSchema = z.object({ sheetId: idField("Sheet"), version: versionField });

/**
 * Replaces a bus network sheet's network with an imported one (already read by
 * lib/sheets/network-import.ts). The same rules as `saveSheet`: the optimistic lock
 * (409 when stale), the author edits a draft or returned revision in place, an
 * approved latest revision gets a new draft revision, a revision in review must be
 * withdrawn first. Unlike a save, the inputs are not limited to the form's size, and
 * a network the engine cannot solve is refused (400 with the engine's messages) rather
 * than stored, so an import never replaces a working network with a broken one. The
 * result is computed here (the authoritative one) with the engine version and content
 * hash; the audit event `network.imported` records the file, the counts and the solve
 * time, in the same transaction. Needs `sheet.write`.
 */
export async function importNetwork(
  actor: Actor,
  raw: { sheetId: unknown; version: unknown; network: Record<string, unknown>; source: NetworkImportSource },
): Promise<NetworkImportResult> {
  requirePermission(actor, "sheet.write");
  const req = parseInput(importRequestSchema, { sheetId: raw.sheetId, version: raw.version });
  const existing = await findSheet(db(), actor.organisationId, req.sheetId);
  if (!existing) throw notFound(SHEET_NOT_FOUND);
  if (existing.kind !== "bus-network") throw validationError({ file: "Only a bus network sheet takes a network file" }, "Only a bus network sheet takes a network file");

  const inputs = asStoredJson(raw.network);
  const t0 = performance.now();
  const outcome = runCalc("bus-network", inputs);
  const solveMs = performance.now() - t0;
  if (!outcome.ok) throw validationError(outcome.fields, "The imported network cannot be solved; nothing was changed");
  // The engine's result is plain JSON data already (numbers, strings, arrays, objects;
  // canonicalJson drops absent fields and writes non-finite numbers as null exactly as
  // the stored JSON will): a round trip of tens of MB would only cost time.
  const results = storable("bus-network", outcome.result) as unknown as Record<string, unknown>;
  const hash = contentHash(inputs, results, ENGINE_VERSION);
  const list = (k: string) => (Array.isArray(inputs[k]) ? (inputs[k] as unknown[]).length : 0);
  const counts = { nodes: list("nodes"), segments: list("segments"), loads: list("loads"), supplies: list("supplies") };

  return db().transaction(async (tx) => {
    const { sheet, version } = await lockVersion(tx, actor, req.sheetId, req.version);
    const latest = await latestOf(tx, actor, sheet.id);
    const edit = editAllowed({ status: latest.status, actorId: actor.id, authorId: latest.authorId });
    if (!edit.ok) throw edit.kind === "status" ? conflict(edit.reason) : forbidden(edit.reason);
    const details = { file: raw.source, counts, solveMs: Math.round(solveMs), contentHash: hash };
    const base = { organisationId: actor.organisationId, actorId: actor.id, entityType: "sheet", entityId: sheet.id, event: "network.imported" } as const;
    const done = (revision: RevisionRef, newRevision: boolean): NetworkImportResult => ({
      sheetId: sheet.id,
      projectId: sheet.projectId,
      version,
      revision,
      newRevision,
      results,
      inputErrors: null,
      counts,
      solveMs,
    });

    if (edit.mode === "in_place") {
      await updateRevision(tx, actor.organisationId, latest.id, { status: "draft", inputs, results, engineVersion: ENGINE_VERSION, contentHash: hash });
      await audit(tx, { ...base, details: { revisionId: latest.id, ordinal: latest.ordinal, label: latest.label, from: latest.status, newRevision: false, ...details } });
      return done(ref(latest, "draft"), false);
    }
    const scheme = await revisionSchemeOf(tx, actor.organisationId);
    const ordinal = latest.ordinal + 1;
    const label = revisionLabel(ordinal, scheme);
    const revisionId = await insertRevision(tx, {
      organisationId: actor.organisationId,
      sheetId: sheet.id,
      ordinal,
      label,
      inputs,
      results,
      engineVersion: ENGINE_VERSION,
      contentHash: hash,
      authorId: actor.id,
    });
    await audit(tx, { ...base, details: { revisionId, ordinal, label, basedOn: { revisionId: latest.id, label: latest.label }, newRevision: true, ...details } });
    return done({ id: revisionId, ordinal, label, status: "draft" }, true);
  });
}
