// Generates public/openapi.json: the OpenAPI 3.1 document of Ohmstead's JSON API.
//   npx tsx scripts/openapi.ts           writes the file
//   npx tsx scripts/openapi.ts --check   exits 1 when the committed file is out of date
// Request bodies come from the same zod schemas the handlers validate with, so the
// document cannot drift from what the server accepts (a unit test compares the file).
import { readFileSync, writeFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import { z } from "zod";
import { CALC_EXAMPLES } from "../app/api/v1/calc/examples";
import { calcInputJsonSchema } from "../app/api/v1/calc/json-schema";
import { createSheetBody, saveSheetBody, transitionBody } from "../app/api/v1/sheets/bodies";
import { tokenCreateBody } from "../app/api/v1/tokens/body";
import { PERMISSIONS, type Permission } from "../lib/auth/roles";
import { CALC_KIND_NAMES, CALC_KINDS, ENGINE_VERSION } from "../lib/engine";
import { ampacityRowSchema } from "../lib/engine/ampacity-table";
import { int } from "../lib/engine/core/schema";
import { TRANSITIONS } from "../lib/sheets/workflow";
import { PROJECT_SORTS, projectFields, projectSchema } from "../lib/validation/project";
import pkg from "../package.json" with { type: "json" };

export const OPENAPI_FILE = fileURLToPath(new URL("../public/openapi.json", import.meta.url));

type Json = Record<string, unknown>;

const ref = (name: string) => ({ $ref: `#/components/schemas/${name}` });
const resp = (name: string) => ({ $ref: `#/components/responses/${name}` });

/** JSON Schema of a zod schema's input side, without the dialect marker. */
function jsonSchema(schema: z.ZodType): Json {
  const { $schema: _dialect, ...rest } = z.toJSONSchema(schema, { io: "input", unrepresentable: "any" }) as Json;
  return rest;
}

function props(s: Json): Record<string, Json> {
  return (s.properties ?? {}) as Record<string, Json>;
}

/* ------------------------------------------------------------------ */
/* Schemas                                                               */
/* ------------------------------------------------------------------ */

const ERROR_CODES = ["validation", "unauthenticated", "forbidden", "not_found", "conflict", "rate_limited", "unavailable"];

const nullable = (s: Json): Json => ({ anyOf: [s, { type: "null" }] });
const dateTime: Json = { type: "string", format: "date-time" };
const idInt: Json = { type: "integer", minimum: 1 };
const person: Json = { type: "object", required: ["id", "name"], properties: { id: idInt, name: { type: "string" } } };
const statusEnum: Json = { type: "string", enum: ["draft", "in_review", "returned", "approved", "superseded"] };

function projectBody(): Json {
  const s = jsonSchema(projectSchema);
  // The frequency arrives as a number in JSON (or as the form's string).
  props(s).frequency = { description: "Hz: 0 for DC", oneOf: [{ type: "number", enum: [0, 50, 60] }, { type: "string", enum: ["0", "50", "60"] }] };
  s.required = [...new Set([...((s.required as string[]) ?? []), "frequency"])];
  props(s).designAmbient = { type: "number", description: "In the project's unit system: °C (metric) or °F (imperial)" };
  props(s).altitude = { type: "number", description: "In the project's unit system: m (metric) or ft (imperial)" };
  return s;
}

function projectPatchBody(): Json {
  const s = jsonSchema(z.object(projectFields).partial().extend({ version: int("Version", 1, 2 ** 32 - 1) }));
  const base = props(projectBody());
  for (const k of Object.keys(props(s))) if (base[k]) props(s)[k] = base[k];
  props(s).version = { type: "integer", minimum: 1, description: "The version the client last read; a stale version is a 409" };
  return s;
}

function sheetBodies() {
  const create = jsonSchema(createSheetBody);
  props(create).kind = { type: "string", enum: [...CALC_KIND_NAMES], description: "Calculation kind (see GET /api/v1/calc)" };
  props(create).inputs = { type: "object", additionalProperties: true, default: {}, description: "The kind's inputs (its request body on /api/v1/calc/{kind}); an invalid draft is stored and its field errors returned" };
  const save = jsonSchema(saveSheetBody);
  props(save).version = { type: "integer", minimum: 1, description: "The sheet version the client last read; a stale version is a 409 and nothing is written" };
  props(save).inputs = { type: "object", additionalProperties: true, description: "The complete inputs (they replace the stored ones)" };
  const transition = jsonSchema(transitionBody);
  props(transition).version = { type: "integer", minimum: 1, description: "The sheet version the client last read" };
  props(transition).comment = nullable({ type: "string", maxLength: 4000, description: "Required for return" });
  return { create, save, transition };
}

const calcResult: Json = {
  type: "object",
  description: "A calculation result. Results are design aids: verification per the governing standard, local codes and a qualified engineer decide.",
  required: ["kind", "engineVersion", "results", "intermediates", "formulas", "warnings", "checks"],
  properties: {
    kind: { type: "string" },
    engineVersion: { type: "string", examples: [ENGINE_VERSION] },
    results: { type: "object", additionalProperties: true, description: "The kind's results, SI units (names carry the unit: _m, _A, _C …)" },
    intermediates: {
      type: "object",
      additionalProperties: { type: "object", required: ["label", "value", "unit"], properties: { label: { type: "string" }, value: { type: ["number", "null"] }, unit: { type: "string" } } },
    },
    formulas: {
      type: "array",
      items: { type: "object", required: ["id", "expression", "source"], properties: { id: { type: "string" }, expression: { type: "string" }, source: { type: "string" } } },
    },
    warnings: { type: "array", items: { type: "object", required: ["code", "message"], properties: { code: { type: "string" }, message: { type: "string" } } } },
    checks: {
      type: "array",
      items: {
        type: "object",
        required: ["id", "label", "value", "limit", "unit", "kind", "pass", "margin"],
        properties: {
          id: { type: "string" },
          label: { type: "string" },
          value: { type: ["number", "null"] },
          limit: { type: ["number", "null"] },
          unit: { type: "string" },
          kind: { type: "string", enum: ["max", "min"] },
          pass: { type: "boolean" },
          margin: { type: ["number", "null"], description: "Positive = spare; null when not finite" },
        },
      },
    },
  },
};

const revisionSummary: Json = {
  type: "object",
  required: ["id", "ordinal", "label", "status", "author", "checkedBy", "submittedAt", "decidedAt", "reviewComment", "engineVersion", "contentHash", "createdAt", "updatedAt"],
  properties: {
    id: idInt,
    ordinal: { type: "integer", minimum: 0 },
    label: { type: "string", description: "A, B … or 0, 1 … (the organisation's scheme)" },
    status: statusEnum,
    author: person,
    checkedBy: nullable(person),
    submittedAt: nullable(dateTime),
    decidedAt: nullable(dateTime),
    reviewComment: nullable({ type: "string" }),
    engineVersion: { type: "string" },
    contentHash: { type: "string", description: "SHA-256 over the canonical JSON of inputs, results and engine version" },
    createdAt: dateTime,
    updatedAt: dateTime,
  },
};

const revision: Json = {
  allOf: [
    ref("RevisionSummary"),
    {
      type: "object",
      required: ["inputs", "results", "inputErrors"],
      properties: {
        inputs: { type: "object", additionalProperties: true },
        results: nullable(ref("CalcResult")),
        inputErrors: nullable({ type: "object", additionalProperties: { type: "string" }, description: "Field errors while the inputs are invalid (results are then null)" }),
      },
    },
  ],
};

const sheetSummary: Json = {
  type: "object",
  required: ["id", "projectId", "kind", "tag", "title", "position", "version", "revision", "author", "checkedBy", "approvedLabel", "submittedAt", "decidedAt", "updatedAt"],
  properties: {
    id: idInt,
    projectId: idInt,
    kind: { type: "string" },
    tag: { type: "string" },
    title: { type: "string" },
    position: { type: "integer" },
    version: { type: "integer", minimum: 1, description: "Send it back with PATCH and transitions" },
    revision: {
      type: "object",
      description: "The latest revision",
      required: ["id", "ordinal", "label", "status"],
      properties: { id: idInt, ordinal: { type: "integer" }, label: { type: "string" }, status: statusEnum },
    },
    author: person,
    checkedBy: nullable({ type: "object", required: ["name"], properties: { name: { type: "string" } } }),
    approvedLabel: nullable({ type: "string", description: "Label of the revision in force (newest approved)" }),
    submittedAt: nullable(dateTime),
    decidedAt: nullable(dateTime),
    updatedAt: dateTime,
  },
};

const sheetRow: Json = {
  type: "object",
  description: "One sheet in a personal list, described by its latest revision",
  required: ["id", "projectId", "projectCode", "projectName", "kind", "kindName", "tag", "title", "label", "status", "authorName", "checkedByName", "approvedLabel", "submittedAt", "updatedAt"],
  properties: {
    id: idInt,
    projectId: idInt,
    projectCode: { type: "string" },
    projectName: { type: "string" },
    kind: { type: "string" },
    kindName: { type: "string" },
    tag: { type: "string" },
    title: { type: "string" },
    label: { type: "string", description: "Label of the latest revision" },
    status: statusEnum,
    authorName: { type: "string" },
    checkedByName: nullable({ type: "string" }),
    approvedLabel: nullable({ type: "string", description: "Label of the revision in force (newest approved)" }),
    submittedAt: nullable(dateTime),
    updatedAt: dateTime,
  },
};

const sheet: Json = {
  type: "object",
  required: ["id", "projectId", "projectCode", "projectName", "kind", "kindTitle", "tag", "title", "position", "version", "approvedLabel", "createdAt", "updatedAt", "latest", "revisions"],
  properties: {
    id: idInt,
    projectId: idInt,
    projectCode: { type: "string" },
    projectName: { type: "string" },
    kind: { type: "string" },
    kindTitle: { type: "string" },
    tag: { type: "string" },
    title: { type: "string" },
    position: { type: "integer" },
    version: { type: "integer", minimum: 1, description: "Send it back with PATCH and transitions (optimistic locking)" },
    approvedLabel: nullable({ type: "string", description: "Label of the revision in force (newest approved)" }),
    createdAt: dateTime,
    updatedAt: dateTime,
    latest: ref("Revision"),
    revisions: { type: "array", items: ref("RevisionSummary"), description: "Every revision, oldest first" },
  },
};

const project: Json = {
  type: "object",
  properties: {
    ...props(projectBody()),
    id: idInt,
    version: { type: "integer", minimum: 1 },
    frequency: { type: "number" },
    designAmbientC: { type: "number" },
    altitudeM: { type: "number" },
    archivedAt: nullable(dateTime),
    createdAt: dateTime,
    updatedAt: dateTime,
    createdBy: { type: "string" },
  },
};

const token: Json = {
  type: "object",
  required: ["id", "name", "prefix", "createdAt", "lastUsedAt", "revokedAt"],
  properties: {
    id: idInt,
    name: { type: "string" },
    prefix: { type: "string", description: "The first characters of the token, to tell tokens apart" },
    createdAt: dateTime,
    lastUsedAt: nullable({ ...dateTime, description: "Recorded at most once a minute" }),
    revokedAt: nullable(dateTime),
  },
};

const errorSchema: Json = {
  type: "object",
  required: ["error"],
  properties: {
    error: {
      type: "object",
      required: ["code", "message"],
      properties: {
        code: { type: "string", enum: ERROR_CODES },
        message: { type: "string", description: "A message a person can act on" },
        fields: { type: "object", additionalProperties: { type: "string" }, description: 'Validation only: "path.to.field" → message naming the field and the allowed range' },
      },
    },
  },
};

/** The error vocabulary: one status per code. */
export const ERROR_RESPONSES: { name: string; status: string; code: string; description: string }[] = [
  { name: "BadRequest", status: "400", code: "validation", description: "Invalid input: `error.fields` names each field and what is allowed" },
  { name: "Unauthorized", status: "401", code: "unauthenticated", description: "No session and no bearer token, or the token is unknown or revoked" },
  { name: "Forbidden", status: "403", code: "forbidden", description: "The user's role does not allow this (or the workflow refuses this person)" },
  { name: "NotFound", status: "404", code: "not_found", description: "No such resource in your organisation (another organisation's ids are 404 too)" },
  { name: "Conflict", status: "409", code: "conflict", description: "Stale `version` (someone saved first: reload and retry) or a state that does not allow the change" },
  { name: "Unavailable", status: "503", code: "unavailable", description: "The database is not reachable; retry shortly" },
];

/* ------------------------------------------------------------------ */
/* Operations                                                            */
/* ------------------------------------------------------------------ */

interface Op {
  summary: string;
  description?: string;
  permission?: Permission;
  /** Session cookie only (no bearer tokens). */
  sessionOnly?: boolean;
  public?: boolean;
  params?: Json[];
  body?: Json;
  example?: unknown;
  ok: { status: string; description: string; schema: Json; contentType?: string };
  errors: string[];
  tag: string;
}

function operation(id: string, op: Op): Json {
  const roles = op.permission ? [...PERMISSIONS[op.permission]] : [];
  const responses: Json = {
    [op.ok.status]: { description: op.ok.description, content: { [op.ok.contentType ?? "application/json"]: { schema: op.ok.schema } } },
  };
  for (const name of op.errors) {
    const e = ERROR_RESPONSES.find((r) => r.name === name);
    if (!e) throw new Error(`unknown error response ${name}`);
    responses[e.status] = resp(name);
  }
  return {
    operationId: id,
    tags: [op.tag],
    summary: op.summary,
    ...(op.description ? { description: op.description } : {}),
    ...(op.public ? { security: [] } : op.sessionOnly ? { security: [{ sessionCookie: [] }] } : {}),
    ...(op.permission ? { "x-permission": op.permission, "x-roles": roles } : {}),
    ...(op.params ? { parameters: op.params } : {}),
    ...(op.body
      ? { requestBody: { required: true, content: { "application/json": { schema: op.body, ...(op.example !== undefined ? { example: op.example } : {}) } } } }
      : {}),
    responses,
  };
}

const pathParam = (name: string, description: string, schema: Json = idInt): Json => ({ name, in: "path", required: true, description, schema });
const projectId = pathParam("id", "Project id");
const sheetId = pathParam("id", "Sheet id");
const AUTH_ERRORS = ["Unauthorized", "Forbidden", "Unavailable"];

function calcPaths(): Json {
  const out: Json = {
    "/api/v1/calc": {
      get: operation("listCalcKinds", {
        tag: "Calculations",
        summary: "List the calculation kinds",
        permission: "sheet.read",
        ok: {
          status: "200",
          description: "The kinds with their titles",
          schema: {
            type: "object",
            required: ["engineVersion", "kinds"],
            properties: {
              engineVersion: { type: "string" },
              kinds: { type: "array", items: { type: "object", required: ["kind", "title", "href"], properties: { kind: { type: "string" }, title: { type: "string" }, href: { type: "string" } } } },
            },
          },
        },
        errors: AUTH_ERRORS,
      }),
    },
    "/api/v1/calc/{kind}": {
      get: operation("getCalcKind", {
        tag: "Calculations",
        summary: "One kind's title and the JSON Schema of its input",
        permission: "sheet.read",
        params: [pathParam("kind", "Calculation kind", { type: "string", enum: [...CALC_KIND_NAMES] })],
        ok: {
          status: "200",
          description: "The kind",
          schema: { type: "object", required: ["kind", "title", "href", "inputSchema"], properties: { kind: { type: "string" }, title: { type: "string" }, href: { type: "string" }, inputSchema: { type: "object" } } },
        },
        errors: ["NotFound", ...AUTH_ERRORS],
      }),
      post: operation("runCalc", {
        tag: "Calculations",
        summary: "Run a calculation (nothing is stored)",
        description: "Posts the kind's inputs in SI units and returns the result. Each kind's body is documented on its own path below. Numbers may also be sent as numeric strings.",
        permission: "sheet.read",
        params: [pathParam("kind", "Calculation kind", { type: "string", enum: [...CALC_KIND_NAMES] })],
        body: { oneOf: CALC_KIND_NAMES.map((k) => ref(calcSchemaName(k))) },
        ok: { status: "200", description: "The calculation result", schema: ref("CalcResult") },
        errors: ["BadRequest", "NotFound", ...AUTH_ERRORS],
      }),
    },
  };
  for (const k of CALC_KIND_NAMES) {
    out[`/api/v1/calc/${k}`] = {
      post: operation(`runCalc_${k.replace(/-/g, "_")}`, {
        tag: "Calculations",
        summary: CALC_KINDS[k].title,
        permission: "sheet.read",
        body: ref(calcSchemaName(k)),
        example: CALC_EXAMPLES[k],
        ok: { status: "200", description: "The calculation result", schema: ref("CalcResult") },
        errors: ["BadRequest", ...AUTH_ERRORS],
      }),
    };
  }
  return out;
}

function calcSchemaName(kind: string): string {
  return `CalcInput_${kind.replace(/-/g, "_")}`;
}

function projectPaths(): Json {
  return {
    "/api/v1/projects": {
      get: operation("listProjects", {
        tag: "Projects",
        summary: "List the organisation's projects",
        permission: "project.read",
        params: [
          { name: "q", in: "query", required: false, description: "Search in code, name, client and site", schema: { type: "string", maxLength: 100 } },
          { name: "sort", in: "query", required: false, schema: { type: "string", enum: [...PROJECT_SORTS], default: "updated" } },
          { name: "dir", in: "query", required: false, schema: { type: "string", enum: ["asc", "desc"], default: "desc" } },
          { name: "archived", in: "query", required: false, description: "1: archived projects instead of active ones", schema: { type: "string", enum: ["0", "1", "true", "false"], default: "0" } },
        ],
        ok: { status: "200", description: "The projects", schema: { type: "object", required: ["projects"], properties: { projects: { type: "array", items: { type: "object", additionalProperties: true } } } } },
        errors: ["BadRequest", ...AUTH_ERRORS],
      }),
      post: operation("createProject", {
        tag: "Projects",
        summary: "Create a project",
        permission: "project.write",
        body: ref("ProjectInput"),
        example: { code: "PNL-204", name: "Pump house MCC", client: "Harrowgate Water Board", site: "North intake", systemVoltage: 400, systemType: "3ph-4w", frequency: 50, earthing: "TN-S", designAmbient: 35, altitude: 120, standardFamily: "iec", unitSystem: "metric" },
        ok: { status: "201", description: "The project", schema: { type: "object", required: ["project"], properties: { project: ref("Project") } } },
        errors: ["BadRequest", ...AUTH_ERRORS],
      }),
    },
    "/api/v1/projects/{id}": {
      get: operation("getProject", {
        tag: "Projects",
        summary: "Read a project",
        permission: "project.read",
        params: [projectId],
        ok: { status: "200", description: "The project", schema: { type: "object", required: ["project"], properties: { project: ref("Project") } } },
        errors: ["NotFound", ...AUTH_ERRORS],
      }),
      patch: operation("updateProject", {
        tag: "Projects",
        summary: "Change a project (any subset of fields plus its version)",
        permission: "project.write",
        params: [projectId],
        body: ref("ProjectPatch"),
        example: { version: 1, name: "Pump house MCC, stage 2" },
        ok: { status: "200", description: "The project", schema: { type: "object", required: ["project"], properties: { project: ref("Project") } } },
        errors: ["BadRequest", "NotFound", "Conflict", ...AUTH_ERRORS],
      }),
    },
    "/api/v1/projects/{id}/archive": {
      post: operation("archiveProject", {
        tag: "Projects",
        summary: "Archive or restore a project",
        permission: "project.archive",
        params: [projectId],
        body: { type: "object", properties: { archived: { type: "boolean", default: true, description: "true archives, false restores" } } },
        example: { archived: true },
        ok: { status: "200", description: "The project", schema: { type: "object", required: ["project"], properties: { project: ref("Project") } } },
        errors: ["BadRequest", "NotFound", "Conflict", ...AUTH_ERRORS],
      }),
    },
  };
}

function sheetPaths(): Json {
  const sheetOk = (description: string, extra: Json = {}) => ({
    type: "object",
    required: ["sheet", ...Object.keys(extra)],
    properties: { sheet: ref("Sheet"), ...extra },
    description,
  });
  const transitionsText = Object.entries(TRANSITIONS)
    .map(([name, t]) => `${name}: ${t.from.join("/")} → ${t.to} (${t.roles.join(", ")}${t.byAuthorOnly ? "; the author only" : ""}${t.notAuthor ? "; not the author" : ""}${t.needsComment ? "; comment required" : ""})`)
    .join("; ");
  return {
    "/api/v1/projects/{id}/sheets": {
      get: operation("listSheets", {
        tag: "Sheets",
        summary: "List a project's calculation sheets",
        permission: "sheet.read",
        params: [projectId],
        ok: { status: "200", description: "The sheets in their order, each with its latest revision", schema: { type: "object", required: ["sheets"], properties: { sheets: { type: "array", items: ref("SheetSummary") } } } },
        errors: ["NotFound", ...AUTH_ERRORS],
      }),
      post: operation("createSheet", {
        tag: "Sheets",
        summary: "Add a calculation sheet to a project",
        description: "Creates the sheet with its first revision as a draft. Inputs that do not validate yet are stored as sent; the results are then null and `inputErrors` names the fields.",
        permission: "sheet.write",
        params: [projectId],
        body: ref("CreateSheetInput"),
        example: { kind: "voltage-drop", tag: "VD-01", title: "Feeder to pump P-3", inputs: CALC_EXAMPLES["voltage-drop"] },
        ok: { status: "201", description: "The new sheet", schema: sheetOk("The sheet", { inputErrors: nullable({ type: "object", additionalProperties: { type: "string" } }) }) },
        errors: ["BadRequest", "NotFound", "Conflict", ...AUTH_ERRORS],
      }),
    },
    "/api/v1/my-sheets": {
      get: operation("mySheets", {
        tag: "Sheets",
        summary: "Sheets whose latest revision you authored, recently changed first",
        permission: "sheet.write",
        ok: { status: "200", description: "Your sheets", schema: { type: "object", required: ["sheets"], properties: { sheets: { type: "array", items: ref("SheetRow") } } } },
        errors: AUTH_ERRORS,
      }),
    },
    "/api/v1/review-queue": {
      get: operation("reviewQueue", {
        tag: "Sheets",
        summary: "Sheets waiting for a check (your own excluded), oldest submission first",
        permission: "sheet.review",
        ok: { status: "200", description: "The queue", schema: { type: "object", required: ["sheets"], properties: { sheets: { type: "array", items: ref("SheetRow") } } } },
        errors: AUTH_ERRORS,
      }),
    },
    "/api/v1/sheets/{id}": {
      get: operation("getSheet", {
        tag: "Sheets",
        summary: "Read a sheet with its latest revision and the list of revisions",
        permission: "sheet.read",
        params: [sheetId],
        ok: { status: "200", description: "The sheet", schema: sheetOk("The sheet") },
        errors: ["NotFound", ...AUTH_ERRORS],
      }),
      patch: operation("saveSheet", {
        tag: "Sheets",
        summary: "Save new inputs (optimistic locking on version)",
        description:
          "A draft or returned revision is edited in place by its author; an approved revision stays locked and the save starts a new draft revision; a revision in review must be withdrawn first (409). A stale `version` is a 409 and nothing is written.",
        permission: "sheet.write",
        params: [sheetId],
        body: ref("SaveSheetInput"),
        example: { version: 1, inputs: { ...CALC_EXAMPLES["voltage-drop"], length_m: 210 } },
        ok: {
          status: "200",
          description: "The sheet after the save",
          schema: sheetOk("The sheet", { newRevision: { type: "boolean" }, inputErrors: nullable({ type: "object", additionalProperties: { type: "string" } }) }),
        },
        errors: ["BadRequest", "NotFound", "Conflict", ...AUTH_ERRORS],
      }),
    },
    "/api/v1/sheets/{id}/revisions/{ordinal}": {
      get: operation("getRevision", {
        tag: "Sheets",
        summary: "Read one revision with its inputs and results",
        permission: "sheet.read",
        params: [sheetId, pathParam("ordinal", "Revision ordinal: 0 for the first revision", { type: "integer", minimum: 0 })],
        ok: { status: "200", description: "The revision", schema: { type: "object", required: ["revision"], properties: { revision: ref("Revision") } } },
        errors: ["NotFound", ...AUTH_ERRORS],
      }),
    },
    "/api/v1/sheets/{id}/pdf": {
      get: operation("getSheetPdf", {
        tag: "Sheets",
        summary: "The calculation sheet as a PDF (latest revision, or ?rev=<ordinal>)",
        description: "An approved revision carries the approval stamp with its verification code and a QR code to /verify/<code>; any other revision prints a DRAFT watermark and no stamp.",
        permission: "sheet.read",
        params: [sheetId, { name: "rev", in: "query", required: false, description: "Revision ordinal (0 for the first); the latest when absent", schema: { type: "integer", minimum: 0 } }],
        ok: { status: "200", description: "The PDF", schema: { type: "string", format: "binary" }, contentType: "application/pdf" },
        errors: ["BadRequest", "NotFound", ...AUTH_ERRORS],
      }),
    },
    "/api/v1/projects/{id}/package": {
      post: operation("issuePackage", {
        tag: "Projects",
        summary: "Issue the project's calculation package: every current approved sheet in one stored PDF",
        description: "The package is stored byte for byte with its SHA-256, so it can be downloaded again exactly as issued. With includeDrafts, sheets without an approved revision are added with a DRAFT watermark.",
        permission: "project.write",
        params: [projectId],
        body: { type: "object", properties: { includeDrafts: { type: "boolean", default: false } } },
        example: { includeDrafts: false },
        ok: { status: "201", description: "The stored package", schema: { type: "object", additionalProperties: true } },
        errors: ["BadRequest", "NotFound", ...AUTH_ERRORS],
      }),
      get: operation("downloadPackage", {
        tag: "Projects",
        summary: "Download an issued package exactly as issued (?upload=<id>); the x-content-sha256 header carries its hash",
        permission: "project.read",
        params: [projectId, { name: "upload", in: "query", required: true, description: "Id of the issued package", schema: idInt }],
        ok: { status: "200", description: "The PDF as issued", schema: { type: "string", format: "binary" }, contentType: "application/pdf" },
        errors: ["BadRequest", "NotFound", ...AUTH_ERRORS],
      }),
    },
    "/api/v1/sheets/{id}/transitions": {
      post: operation("transitionSheet", {
        tag: "Sheets",
        summary: "Move the latest revision through review",
        description: `Transitions: ${transitionsText}. Submitting needs valid inputs (400 with the fields otherwise). A lead never approves their own sheet.`,
        permission: "sheet.read",
        params: [sheetId],
        body: ref("TransitionInput"),
        example: { transition: "submit", version: 2 },
        ok: { status: "200", description: "The sheet after the transition", schema: sheetOk("The sheet", { superseded: { type: "array", items: { type: "string" }, description: "Labels of revisions this approval superseded" } }) },
        errors: ["BadRequest", "NotFound", "Conflict", ...AUTH_ERRORS],
      }),
    },
  };
}

function tokenPaths(): Json {
  return {
    "/api/v1/tokens": {
      get: operation("listTokens", {
        tag: "API tokens",
        summary: "List your API tokens (signed-in session only)",
        permission: "token.manage",
        sessionOnly: true,
        ok: { status: "200", description: "Your tokens, newest first; revoked ones carry revokedAt", schema: { type: "object", required: ["tokens"], properties: { tokens: { type: "array", items: ref("Token") } } } },
        errors: AUTH_ERRORS,
      }),
      post: operation("createToken", {
        tag: "API tokens",
        summary: "Create an API token (signed-in session only; a token cannot create tokens)",
        description: "The secret is returned once and never stored in readable form: copy it now.",
        permission: "token.manage",
        sessionOnly: true,
        body: jsonSchema(tokenCreateBody),
        example: { name: "Build server" },
        ok: {
          status: "201",
          description: "The token and its secret (shown once)",
          schema: { type: "object", required: ["token", "secret"], properties: { token: ref("Token"), secret: { type: "string", description: "Send as `Authorization: Bearer <secret>`" } } },
        },
        errors: ["BadRequest", ...AUTH_ERRORS],
      }),
    },
    "/api/v1/tokens/{id}": {
      delete: operation("revokeToken", {
        tag: "API tokens",
        summary: "Revoke one of your API tokens (signed-in session only)",
        permission: "token.manage",
        sessionOnly: true,
        params: [pathParam("id", "Token id")],
        ok: { status: "200", description: "Revoked (revoking twice changes nothing)", schema: { type: "object", required: ["revoked", "id", "revokedAt"], properties: { revoked: { type: "boolean" }, id: idInt, revokedAt: dateTime } } },
        errors: ["NotFound", ...AUTH_ERRORS],
      }),
    },
  };
}

const ampacityTableSummary: Json = {
  type: "object",
  required: ["id", "name", "version", "source", "rowCount", "active", "createdAt"],
  properties: {
    id: idInt,
    name: { type: "string" },
    version: { type: "integer", minimum: 1, description: "1, 2, 3 … per name" },
    source: { type: "string", description: "Where the values come from, as the admin wrote it" },
    rowCount: { type: "integer" },
    active: { type: "boolean", description: "False once retired: no longer offered for new work" },
    createdAt: dateTime,
    createdByName: nullable({ type: "string" }),
    retiredAt: nullable(dateTime),
  },
};

function ampacityPaths(): Json {
  return {
    "/api/v1/ampacity-tables": {
      get: operation("listAmpacityTables", {
        tag: "Ampacity tables",
        summary: "The organisation's ampacity tables, one entry per version (names A→Z, newest version first)",
        permission: "ampacity.read",
        params: [{ name: "active", in: "query", required: false, description: "1: active versions only", schema: { type: "string", enum: ["0", "1"] } }],
        ok: { status: "200", description: "The versions", schema: { type: "object", required: ["tables"], properties: { tables: { type: "array", items: ref("AmpacityTableSummary") } } } },
        errors: ["BadRequest", ...AUTH_ERRORS],
      }),
    },
    "/api/v1/ampacity-tables/{id}": {
      get: operation("getAmpacityTable", {
        tag: "Ampacity tables",
        summary: "One version with its rows (SI: m², °C, A) and the uploaded file's SHA-256",
        permission: "ampacity.read",
        params: [pathParam("id", "Ampacity table version id")],
        ok: {
          status: "200",
          description: "The version",
          schema: {
            type: "object",
            required: ["table"],
            properties: {
              table: {
                allOf: [
                  ref("AmpacityTableSummary"),
                  { type: "object", required: ["fileSha256", "rows"], properties: { fileSha256: { type: "string", pattern: "^[0-9a-f]{64}$" }, rows: { type: "array", items: ref("AmpacityRow") } } },
                ],
              },
            },
          },
        },
        errors: ["NotFound", ...AUTH_ERRORS],
      }),
    },
  };
}

function healthPath(): Json {
  return {
    "/api/health": {
      get: operation("health", {
        tag: "Service",
        summary: "Whether the app runs and reaches its database (no sign-in)",
        public: true,
        ok: {
          status: "200",
          description: "Up (503 with the same body when the database is down)",
          schema: { type: "object", properties: { app: { type: "string" }, database: { type: "string", enum: ["ok", "down"] }, version: { type: "string" } } },
        },
        errors: [],
      }),
    },
  };
}

/** The whole document. Deterministic: the same code gives the same bytes. */
export function buildOpenApi(): Json {
  const bodies = sheetBodies();
  const schemas: Json = {
    Error: errorSchema,
    CalcResult: calcResult,
    ProjectInput: projectBody(),
    ProjectPatch: projectPatchBody(),
    Project: project,
    CreateSheetInput: bodies.create,
    SaveSheetInput: bodies.save,
    TransitionInput: bodies.transition,
    SheetSummary: sheetSummary,
    SheetRow: sheetRow,
    Sheet: sheet,
    RevisionSummary: revisionSummary,
    Revision: revision,
    Token: token,
    AmpacityTableSummary: ampacityTableSummary,
    AmpacityRow: jsonSchema(ampacityRowSchema),
  };
  for (const k of CALC_KIND_NAMES) schemas[calcSchemaName(k)] = { title: CALC_KINDS[k].title, ...calcInputJsonSchema(k) };

  const responses: Json = {};
  for (const e of ERROR_RESPONSES) {
    responses[e.name] = {
      description: e.description,
      content: { "application/json": { schema: ref("Error"), example: { error: { code: e.code, message: exampleMessage(e.code), ...(e.code === "validation" ? { fields: { length_m: "Route length must be from 0 to 100000 m" } } : {}) } } } },
    };
  }

  return {
    openapi: "3.1.0",
    info: {
      title: "Ohmstead API",
      version: String(pkg.version),
      description:
        "Calculation sheets, projects and stateless calculations for panel builders. Authenticate with `Authorization: Bearer <token>` (create a token under Account → API tokens) or the signed-in session. Every response is JSON; errors share one shape. Another organisation's ids answer 404. Results are design aids: verification per the governing standard, local codes and a qualified engineer decide.",
    },
    servers: [{ url: "/", description: "This Ohmstead server" }],
    security: [{ bearerAuth: [] }, { sessionCookie: [] }],
    tags: [
      { name: "Calculations", description: "Run the engine on inputs without storing anything" },
      { name: "Projects", description: "The organisation's projects" },
      { name: "Sheets", description: "Calculation sheets, their revisions and review" },
      { name: "API tokens", description: "Personal tokens for scripts and other programs" },
      { name: "Ampacity tables", description: "The organisation's versioned ampacity tables (uploaded by admins in the app)" },
      { name: "Service", description: "Health" },
    ],
    paths: { ...calcPaths(), ...projectPaths(), ...sheetPaths(), ...tokenPaths(), ...ampacityPaths(), ...healthPath() },
    components: {
      securitySchemes: {
        bearerAuth: { type: "http", scheme: "bearer", description: "A personal API token; it acts with its owner's role and organisation" },
        sessionCookie: { type: "apiKey", in: "cookie", name: "next-auth.session-token", description: "The browser session of a signed-in user" },
      },
      schemas,
      responses,
    },
  };
}

function exampleMessage(code: string): string {
  return (
    {
      validation: "Some fields need attention",
      unauthenticated: "The API token is not valid or was revoked",
      forbidden: "Your role does not allow this",
      not_found: "Sheet not found",
      conflict: "Someone else saved this sheet since you opened it; reload to see their changes",
      unavailable: "The database is not reachable; try again shortly",
    } as Record<string, string>
  )[code] ?? code;
}

export function renderOpenApi(): string {
  return `${JSON.stringify(buildOpenApi(), null, 2)}\n`;
}

function main() {
  const text = renderOpenApi();
  if (process.argv.includes("--check")) {
    let current = "";
    try {
      current = readFileSync(OPENAPI_FILE, "utf8");
    } catch {
      /* missing counts as out of date */
    }
    if (current !== text) {
      console.error("public/openapi.json is out of date: run npx tsx scripts/openapi.ts");
      process.exit(1);
    }
    console.log("public/openapi.json is up to date");
    return;
  }
  writeFileSync(OPENAPI_FILE, text);
  console.log(`wrote public/openapi.json (${Object.keys(buildOpenApi().paths as Json).length} paths)`);
}

if (process.argv[1] && fileURLToPath(import.meta.url) === process.argv[1]) main();
