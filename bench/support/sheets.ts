// The bench project and its sheets, made through the JSON API with the bench engineer's
// token (the same path an API client takes), and reused by later runs.
import { sheetKind, type ProjectBasis } from "../../lib/sheets/kinds";

export const BENCH_PROJECT_CODE = "BENCH-LIVE";

const BASIS: ProjectBasis = {
  unitSystem: "metric",
  systemVoltage: 400,
  systemType: "3ph-4w",
  frequency: 50,
  designAmbientC: 35,
  altitudeM: 0,
  standardFamily: "iec",
};

async function api<T>(baseURL: string, token: string, method: string, path: string, body?: unknown): Promise<T> {
  const res = await fetch(baseURL + path, {
    method,
    headers: { authorization: `Bearer ${token}`, ...(body === undefined ? {} : { "content-type": "application/json" }) },
    body: body === undefined ? undefined : JSON.stringify(body),
    signal: AbortSignal.timeout(30_000),
  });
  const text = await res.text();
  if (!res.ok) throw new Error(`bench: ${method} ${path} answered ${res.status}: ${text.slice(0, 500)}`);
  return JSON.parse(text) as T;
}

interface SheetSummary {
  id: number;
  kind: string;
  tag: string;
  revision: { status: string };
  author: { id: number };
}

export interface BenchSheets {
  projectId: number;
  /** Sheet ids by kind. */
  sheets: Record<string, number>;
}

/**
 * The bench project with one draft sheet per requested kind, authored by the token's
 * user (so the editor opens editable for that user). A sheet that is no longer an
 * editable draft of that user is left alone and a new one is added.
 */
export async function ensureBenchSheets(
  baseURL: string,
  token: string,
  authorId: number,
  kinds: readonly string[],
  /** Inputs (SI) to start a kind from instead of the project's defaults. */
  inputsFor: Record<string, Record<string, unknown>> = {},
): Promise<BenchSheets> {
  const found = await api<{ projects: { id: number; code: string }[] }>(baseURL, token, "GET", `/api/v1/projects?q=${encodeURIComponent(BENCH_PROJECT_CODE)}`);
  let projectId = found.projects.find((p) => p.code === BENCH_PROJECT_CODE)?.id;
  if (projectId === undefined) {
    const made = await api<{ project: { id: number } }>(baseURL, token, "POST", "/api/v1/projects", {
      code: BENCH_PROJECT_CODE,
      name: "Live calculation benchmark",
      client: "",
      site: "",
      systemVoltage: BASIS.systemVoltage,
      systemType: BASIS.systemType,
      frequency: BASIS.frequency,
      earthing: "TN-S",
      designAmbient: BASIS.designAmbientC,
      altitude: BASIS.altitudeM,
      standardFamily: BASIS.standardFamily,
      unitSystem: BASIS.unitSystem,
      notes: "Made by `npm run bench` in the bench organisation; safe to archive.",
    });
    projectId = made.project.id;
  }
  const { sheets } = await api<{ sheets: SheetSummary[] }>(baseURL, token, "GET", `/api/v1/projects/${projectId}/sheets`);
  const out: Record<string, number> = {};
  for (const kind of kinds) {
    const def = sheetKind(kind);
    if (!def) throw new Error(`bench: unknown sheet kind ${kind}`);
    const usable = sheets.find((s) => s.kind === kind && s.author.id === authorId && (s.revision.status === "draft" || s.revision.status === "returned"));
    if (usable) {
      out[kind] = usable.id;
      continue;
    }
    const taken = new Set(sheets.map((s) => s.tag));
    let n = 1;
    while (taken.has(`${def.tagPrefix}-${String(n).padStart(2, "0")}`)) n++;
    const made = await api<{ sheet: { id: number } }>(baseURL, token, "POST", `/api/v1/projects/${projectId}/sheets`, {
      kind,
      tag: `${def.tagPrefix}-${String(n).padStart(2, "0")}`,
      title: `${def.name} (bench)`,
      inputs: inputsFor[kind] ?? def.defaults(BASIS),
    });
    out[kind] = made.sheet.id;
  }
  return { projectId, sheets: out };
}
