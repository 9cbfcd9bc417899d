import { z } from "zod";
import { EARTHING_ARRANGEMENTS, STANDARD_FAMILIES, SYSTEM_TYPES, UNIT_SYSTEMS, type SystemType, type UnitSystem } from "@/db/schema/projects";
import { choice, int } from "@/lib/engine/core/schema";

/**
 * The project form's schema, used by the browser form, the server action and the JSON
 * API alike. Design ambient and altitude are entered in the project's unit system
 * (°C and m for metric, °F and ft for imperial); `toProjectRecord` converts them to the
 * SI values stored in the database.
 */

export const SYSTEM_TYPE_LABELS: Record<SystemType, string> = {
  "3ph-4w": "Three-phase, four-wire",
  "3ph-3w": "Three-phase, three-wire",
  "1ph": "Single-phase",
  dc: "DC",
};
export const STANDARD_FAMILY_LABELS: Record<(typeof STANDARD_FAMILIES)[number], string> = {
  iec: "IEC",
  "north-american": "North American",
};
export const UNIT_SYSTEM_LABELS: Record<UnitSystem, string> = {
  metric: "Metric (°C, m)",
  imperial: "Imperial (°F, ft)",
};
export const FREQUENCY_CHOICES = ["50", "60", "0"] as const;
export const FREQUENCY_LABELS: Record<(typeof FREQUENCY_CHOICES)[number], string> = { "50": "50 Hz", "60": "60 Hz", "0": "DC (0 Hz)" };

/**
 * Ranges. Low voltage is up to 1000 V AC and 1500 V DC (IEC 60364-1:2005 clause 11.1,
 * voltage band II); 12 V is the smallest system a panel would be designed around.
 */
export const PROJECT_LIMITS = {
  voltageAc: { min: 12, max: 1000 },
  voltageDc: { min: 12, max: 1500 },
  ambientC: { min: -40, max: 70 },
  ambientF: { min: -40, max: 158 },
  altitudeM: { min: 0, max: 5000 },
  altitudeFt: { min: 0, max: 16400 },
  notes: 4000,
} as const;

/** Shown when a save is refused because the project changed since the form was opened (409). */
export const STALE_PROJECT_MESSAGE = "Someone else saved this project since you opened it — reload to see their changes";

export const PROJECT_CODE_PATTERN = /^[A-Za-z0-9_/-]{2,40}$/;

const text = (label: string, max: number, required: boolean) => {
  const s = z.string({ error: (iss) => (iss.input === undefined ? `${label} is required` : `${label} must be text`) }).trim();
  return required
    ? s.min(1, `${label} is required`).max(max, `${label} must be at most ${max} characters`)
    : s.max(max, `${label} must be at most ${max} characters`);
};

/** Parses a number from a form string or a JSON number; the range is checked with the unit system in mind. */
const measured = (label: string) =>
  z.preprocess(
    (v) => {
      if (typeof v === "string") {
        const t = v.trim().replace(/\s+/g, "").replace(/^−/, "-");
        if (t === "") return undefined;
        return /^[-+]?(\d+\.?\d*|\.\d+)([eE][-+]?\d+)?$/.test(t) ? Number(t) : Number.NaN;
      }
      return v;
    },
    z
      .number({ error: (iss) => (iss.input === undefined ? `${label} is required` : `${label} must be a number`) })
      .refine((n) => Number.isFinite(n), { message: `${label} must be a finite number` }),
  ) as unknown as z.ZodType<number, unknown>;

export const projectFields = {
  code: z
    .string({ error: () => "Project code is required" })
    .trim()
    .min(1, "Project code is required")
    .regex(PROJECT_CODE_PATTERN, "Project code must be 2 to 40 characters: letters, digits, - _ /"),
  name: text("Project name", 160, true),
  client: text("Client", 160, false).default(""),
  site: text("Site", 160, false).default(""),
  systemVoltage: measured("System voltage"),
  systemType: choice("System type", SYSTEM_TYPES),
  frequency: z.preprocess((v) => (typeof v === "number" ? String(v) : v), choice("Frequency", FREQUENCY_CHOICES)).transform(Number),
  earthing: choice("Earthing arrangement", EARTHING_ARRANGEMENTS),
  designAmbient: measured("Design ambient temperature"),
  altitude: measured("Altitude"),
  standardFamily: choice("Standard family", STANDARD_FAMILIES),
  unitSystem: choice("Unit system", UNIT_SYSTEMS),
  notes: text("Notes", PROJECT_LIMITS.notes, false).default(""),
};

type ProjectShape = z.output<z.ZodObject<typeof projectFields>>;

function rangeIssue(value: unknown, min: number, max: number, message: string) {
  return typeof value === "number" && Number.isFinite(value) && (value < min || value > max) ? message : null;
}

/** Cross-field rules: ranges that depend on the system type and the unit system. */
function checkProject(p: Partial<ProjectShape>, ctx: z.RefinementCtx) {
  const add = (path: keyof ProjectShape, message: string | null) => {
    if (message) ctx.addIssue({ code: "custom", path: [path], message });
  };
  const dc = p.systemType === "dc";
  const v = dc ? PROJECT_LIMITS.voltageDc : PROJECT_LIMITS.voltageAc;
  if (p.systemType !== undefined || typeof p.systemVoltage === "number") {
    add("systemVoltage", rangeIssue(p.systemVoltage, v.min, v.max, `System voltage must be from ${v.min} to ${v.max} V ${dc ? "DC" : "AC"}`));
  }
  if (p.systemType !== undefined && typeof p.frequency === "number") {
    if (dc && p.frequency !== 0) add("frequency", "Frequency must be DC (0 Hz) for a DC system");
    if (!dc && p.frequency === 0) add("frequency", "Frequency must be 50 or 60 Hz for an AC system");
  }
  const imperial = p.unitSystem === "imperial";
  const t = imperial ? PROJECT_LIMITS.ambientF : PROJECT_LIMITS.ambientC;
  add("designAmbient", rangeIssue(p.designAmbient, t.min, t.max, `Design ambient temperature must be from ${t.min} to ${t.max} ${imperial ? "°F" : "°C"}`));
  const a = imperial ? PROJECT_LIMITS.altitudeFt : PROJECT_LIMITS.altitudeM;
  add("altitude", rangeIssue(p.altitude, a.min, a.max, `Altitude must be from ${a.min} to ${a.max} ${imperial ? "ft" : "m"}`));
}

/** Runs the cross-field rules even when other fields failed, so every message shows at once. */
function withProjectRules<S extends z.ZodType<ProjectShape>>(schema: S) {
  return schema.superRefine((p, ctx) => checkProject(p, ctx), {
    when: (payload) => typeof payload.value === "object" && payload.value !== null,
  });
}

export const projectSchema = withProjectRules(z.object(projectFields));
export type ProjectInput = z.output<typeof projectSchema>;
/** What the form holds: strings from the inputs. */
export type ProjectFormValues = z.input<typeof projectSchema>;

const idField = int("Project id", 1, 2 ** 32 - 1);
const versionField = int("Version", 1, 2 ** 32 - 1);

export const projectUpdateSchema = withProjectRules(z.object({ ...projectFields, id: idField, version: versionField }));
export type ProjectUpdateInput = z.output<typeof projectUpdateSchema>;

export const projectArchiveSchema = z.object({
  id: idField,
  archived: z.boolean({ error: () => "Archived must be true or false" }),
});

/** Query string of GET /api/v1/projects. */
export const PROJECT_SORTS = ["code", "name", "client", "updated"] as const;
export type ProjectSort = (typeof PROJECT_SORTS)[number];
export const projectListQuerySchema = z.object({
  q: z.string().trim().max(100, "Search must be at most 100 characters").default(""),
  sort: choice("Sort", PROJECT_SORTS).default("updated"),
  dir: choice("Direction", ["asc", "desc"]).default("desc"),
  archived: z
    .enum(["0", "1", "true", "false"], { error: () => "Archived must be 0 or 1" })
    .default("0")
    .transform((v) => v === "1" || v === "true"),
});
export type ProjectListQuery = z.output<typeof projectListQuerySchema>;

// Unit conversions at the edge: °F = °C × 9/5 + 32; 1 ft = 0.3048 m exactly (international foot, 1959).
const FT = 0.3048;
export const cToF = (c: number) => (c * 9) / 5 + 32;
export const fToC = (f: number) => ((f - 32) * 5) / 9;
export const mToFt = (m: number) => m / FT;
export const ftToM = (ft: number) => ft * FT;
/** Rounds away binary noise from a conversion (e.g. 94.99999999 → 95) for display. */
export const tidy = (x: number, decimals = 2) => Number(x.toFixed(decimals));

/** The stored (SI) form of a validated project. */
export interface ProjectRecordValues {
  code: string;
  name: string;
  client: string;
  site: string;
  systemVoltage: number;
  systemType: SystemType;
  frequency: number;
  earthing: (typeof EARTHING_ARRANGEMENTS)[number];
  designAmbientC: number;
  altitudeM: number;
  standardFamily: (typeof STANDARD_FAMILIES)[number];
  unitSystem: UnitSystem;
  notes: string;
}

export function toProjectRecord(p: ProjectInput): ProjectRecordValues {
  const imperial = p.unitSystem === "imperial";
  return {
    code: p.code,
    name: p.name,
    client: p.client,
    site: p.site,
    systemVoltage: p.systemVoltage,
    systemType: p.systemType,
    frequency: p.frequency,
    earthing: p.earthing,
    designAmbientC: imperial ? fToC(p.designAmbient) : p.designAmbient,
    altitudeM: imperial ? ftToM(p.altitude) : p.altitude,
    standardFamily: p.standardFamily,
    unitSystem: p.unitSystem,
    notes: p.notes,
  };
}

/** The form's values (strings, in the project's units) for a stored project. */
export function toProjectFormValues(r: ProjectRecordValues): Record<keyof ProjectFormValues, string> {
  const imperial = r.unitSystem === "imperial";
  return {
    code: r.code,
    name: r.name,
    client: r.client,
    site: r.site,
    systemVoltage: String(r.systemVoltage),
    systemType: r.systemType,
    frequency: String(r.frequency),
    earthing: r.earthing,
    designAmbient: String(imperial ? tidy(cToF(r.designAmbientC)) : tidy(r.designAmbientC)),
    altitude: String(imperial ? tidy(mToFt(r.altitudeM), 0) : tidy(r.altitudeM)),
    standardFamily: r.standardFamily,
    unitSystem: r.unitSystem,
    notes: r.notes,
  };
}
