/**
 * Bus network on the server: a generated panel of about 100 000 nodes with spare
 * (unloaded) ways, timed (a) as the engine solve alone and (b) through the import
 * path a user's file takes: read the file (JSON and CSV) + solve + store a revision
 * in the database (inputs, results, content hash, audit event, one transaction) +
 * read the revision back, with the process's peak resident set.
 *
 * The import path goes through lib/sheets/service.ts, whose modules are marked
 * server-only; it runs in a child process started with the `react-server` condition
 * (as Next runs it), against the database of .env.local, in the bench organisation
 * (bench/support/actors.ts) and a project of its own (code BENCH-NET), so nothing shows
 * up in the demo organisation. The child prints its figures as one JSON line.
 *
 * Memory: `process.resourceUsage().maxRSS` only grows, so each figure is the peak up
 * to and including that step.
 */
import { spawn } from "node:child_process";
import { fileURLToPath } from "node:url";
import type { NetworkInput } from "../lib/engine/network";

const TARGET_NODES = 100_000;
const SOLVE_RUNS = 3;

/**
 * A panel with spare ways: a main bus (nodes every 0.2 m), at every bus node a
 * dropper of 8 nodes 0.15 m apart and a tap-off cable (1–3 m) from each dropper node
 * to an outgoing terminal. Every fourth terminal is a spare way with no load (a dead
 * end: its tap-off carries exactly 0 A); every 10th dropper is tied at its foot to the
 * next one; an incomer every 60 bus nodes (at most 100). 17 nodes per bus node.
 * Deterministic (a fixed linear congruential sequence).
 */
export function sparePanel(targetNodes: number, mode: "ac" | "dc" = "ac"): NetworkInput {
  const drop = 8;
  const busNodes = Math.max(2, Math.round(targetNodes / (1 + 2 * drop)));
  const nodes: { id: string }[] = [];
  const segments: { id: string; from: string; to: string; conductor: string; length_m: number }[] = [];
  const loads: { node: string; current_A: number; pf: number }[] = [];
  let seed = 20240611;
  const rnd = () => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648;
  };
  const round = (x: number) => Math.round(x * 1000) / 1000;
  for (let b = 0; b < busNodes; b++) {
    nodes.push({ id: `B${b}` });
    if (b > 0) segments.push({ id: `MB${b}`, from: `B${b - 1}`, to: `B${b}`, conductor: "main", length_m: 0.2 });
    for (let d = 0; d < drop; d++) {
      const dn = `D${b}_${d}`;
      nodes.push({ id: dn });
      segments.push({ id: `DR${b}_${d}`, from: d === 0 ? `B${b}` : `D${b}_${d - 1}`, to: dn, conductor: "dropper", length_m: 0.15 });
      const t = `T${b}_${d}`;
      nodes.push({ id: t });
      segments.push({ id: `TO${b}_${d}`, from: dn, to: t, conductor: "tap", length_m: round(1 + 2 * rnd()) });
      if (d % 4 !== 3) loads.push({ node: t, current_A: round(2 + 20 * rnd()), pf: round(0.8 + 0.2 * rnd()) });
    }
    if (b % 10 === 0 && b + 1 < busNodes) segments.push({ id: `TIE${b}`, from: `D${b}_${drop - 1}`, to: `D${b + 1}_${drop - 1}`, conductor: "dropper", length_m: 0.2 });
  }
  const supplies: { node: string; voltage_V: number }[] = [];
  for (let b = 0; b < busNodes && supplies.length < 100; b += 60) supplies.push({ node: `B${b}`, voltage_V: 230 });
  return {
    mode,
    frequency_Hz: 50,
    ambient_C: 35,
    maxTemperature_C: 90,
    conductors: [
      { id: "main", materialId: "cu-etp", area_m2: 2e-3, count: 4, conductorTemperature_C: 70, reactance_ohm_per_m: 1.5e-4, ampacity_A: 3200 },
      { id: "dropper", materialId: "cu-etp", area_m2: 6e-4, conductorTemperature_C: 70, reactance_ohm_per_m: 2e-4, ampacity_A: 1200 },
      { id: "tap", materialId: "cu-annealed", area_m2: 16e-6, conductorTemperature_C: 70, reactance_ohm_per_m: 8e-5, ampacity_A: 80 },
    ],
    nodes,
    segments,
    supplies,
    loads,
  };
}

/** The network as a CSV file of the import format (lib/sheets/network-import.ts). */
export function networkCsv(net: NetworkInput): string {
  const cols = ["record", "id", "material", "area_mm2", "count", "temperature_C", "reactance_mohm_per_m", "ampacity_A", "from", "to", "conductor", "length_m", "node", "current_A", "pf", "voltage_V", "name", "value"];
  const at = Object.fromEntries(cols.map((c, i) => [c, i])) as Record<string, number>;
  const out = [cols.join(",")];
  const row = (v: Record<string, unknown>) => {
    const r: string[] = new Array<string>(cols.length).fill("");
    for (const [k, x] of Object.entries(v)) if (x !== undefined) r[at[k]!] = String(x);
    out.push(r.join(","));
  };
  row({ record: "setting", name: "mode", value: net.mode });
  for (const k of ["frequency_Hz", "ambient_C", "maxTemperature_C"] as const) if (net[k] !== undefined) row({ record: "setting", name: k, value: net[k] });
  for (const c of net.conductors)
    row({
      record: "conductor",
      id: c.id,
      material: c.materialId,
      area_mm2: c.area_m2 === undefined ? undefined : Number((Number(c.area_m2) * 1e6).toPrecision(9)),
      count: c.count,
      temperature_C: c.conductorTemperature_C,
      reactance_mohm_per_m: c.reactance_ohm_per_m === undefined ? undefined : Number((Number(c.reactance_ohm_per_m) * 1e3).toPrecision(9)),
      ampacity_A: c.ampacity_A,
    });
  for (const s of net.segments) row({ record: "segment", id: s.id, from: s.from, to: s.to, conductor: s.conductor, length_m: s.length_m });
  for (const s of net.supplies) row({ record: "supply", node: s.node, voltage_V: s.voltage_V });
  for (const l of net.loads ?? []) row({ record: "load", node: l.node, current_A: l.current_A, pf: l.pf });
  return out.join("\n") + "\n";
}

const mb = (bytes: number) => (bytes / 2 ** 20).toFixed(0);
const peakRss = () => process.resourceUsage().maxRSS * 1024;
const median = (xs: number[]) => [...xs].sort((p, q) => p - q)[Math.floor(xs.length / 2)]!;

interface ChildFigures {
  rows: [string, string, string][];
  error?: string;
}

/** The child: runs the service's import path against the database (needs the react-server condition). */
async function child(): Promise<void> {
  const rows: [string, string, string][] = [];
  const { loadEnvFile } = await import("../scripts/load-env");
  loadEnvFile();
  const [{ and, eq }, { closeDb, db }, schema, { parseNetworkFile }, service, { defaultInputs }] = await Promise.all([
    import("drizzle-orm"),
    import("../db/client"),
    import("../db/schema"),
    import("../lib/sheets/network-import"),
    import("../lib/sheets/service"),
    import("../lib/sheets/kinds"),
  ]);
  try {
    const [org] = await db().select({ id: schema.organisations.id }).from(schema.organisations).where(eq(schema.organisations.slug, "ohmstead-bench")).limit(1);
    const [user] = org ? await db().select().from(schema.users).where(and(eq(schema.users.organisationId, org.id), eq(schema.users.role, "engineer"))).limit(1) : [];
    if (!org || !user) throw new Error("the bench organisation has no engineer; run the bench through bench/run.ts");
    const actor = { id: user.id, organisationId: org.id, role: user.role, name: user.name, email: user.email };
    let [project] = await db().select({ id: schema.projects.id }).from(schema.projects).where(and(eq(schema.projects.organisationId, org.id), eq(schema.projects.code, "BENCH-NET"))).limit(1);
    if (!project) {
      const [made] = await db()
        .insert(schema.projects)
        .values({ organisationId: org.id, code: "BENCH-NET", name: "Bench: large bus network", systemVoltage: 400, systemType: "3ph-4w", frequency: 50, earthing: "TN-S", designAmbient: 35, standardFamily: "iec", unitSystem: "metric", createdById: user.id })
        .$returningId();
      project = made!;
    }
    const basis = { unitSystem: "metric", systemVoltage: 400, systemType: "3ph-4w", frequency: 50, designAmbientC: 35, altitudeM: 0, standardFamily: "iec" } as const;

    const net = sparePanel(TARGET_NODES, "ac");
    for (const [format, text] of [
      ["json", JSON.stringify(net)],
      ["csv", networkCsv(net)],
    ] as const) {
      const created = await service.createSheet(actor, { projectId: project.id, kind: "bus-network", tag: `BN-${Date.now().toString(36).toUpperCase()}`, title: `Bench import (${format})`, inputs: defaultInputs("bus-network", basis) });
      const bytes = new TextEncoder().encode(text);
      const t0 = performance.now();
      const parsed = parseNetworkFile(`panel.${format}`, bytes);
      const t1 = performance.now();
      if (!parsed.ok) throw new Error(`the generated ${format} file did not read: ${JSON.stringify(parsed.problems.slice(0, 3))}`);
      const r = await service.importNetwork(actor, {
        sheetId: created.sheetId,
        version: created.version,
        network: parsed.network as unknown as Record<string, unknown>,
        source: { fileName: `panel.${format}`, format: parsed.format, bytes: bytes.byteLength },
      });
      const t2 = performance.now();
      const back = await service.getRevision(actor, created.sheetId, r.revision.ordinal);
      const t3 = performance.now();
      // a large network is stored with its per-segment values as columns (compactNetworkResult)
      const segs = (back.results?.results as { columns?: { segments: { id: unknown[] } } } | undefined)?.columns?.segments.id.length ?? 0;
      if (segs !== parsed.counts.segments) throw new Error(`read back ${segs} segment results, expected ${parsed.counts.segments}`);
      rows.push([
        `import ${format} (${mb(bytes.byteLength)} MB file): read file`,
        (t1 - t0).toFixed(0),
        mb(peakRss()),
      ]);
      rows.push([`  + solve (engine, in importNetwork)`, r.solveMs.toFixed(0), ""]);
      rows.push([`  + hash + store in one transaction (whole importNetwork ${(t2 - t1).toFixed(0)} ms)`, (t2 - t1 - r.solveMs).toFixed(0), ""]);
      rows.push([`  + read the revision back`, (t3 - t2).toFixed(0), ""]);
      rows.push([`  = import path total`, (t3 - t0).toFixed(0), mb(peakRss())]);
      // the bench sheets are not kept: they would only fill the bench project
      await db().delete(schema.sheetRevisions).where(and(eq(schema.sheetRevisions.organisationId, org.id), eq(schema.sheetRevisions.sheetId, created.sheetId)));
      await db().delete(schema.sheets).where(and(eq(schema.sheets.organisationId, org.id), eq(schema.sheets.id, created.sheetId)));
    }
    console.log(JSON.stringify({ rows } satisfies ChildFigures));
  } catch (e) {
    console.log(JSON.stringify({ rows, error: e instanceof Error ? e.message : String(e) } satisfies ChildFigures));
  } finally {
    await closeDb();
  }
}

function runChild(): Promise<ChildFigures> {
  return new Promise((resolve) => {
    const file = fileURLToPath(import.meta.url);
    const p = spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", file, "--child"], { stdio: ["ignore", "pipe", "inherit"], env: process.env });
    let out = "";
    p.stdout.on("data", (c: Buffer) => (out += c.toString()));
    p.on("close", (code) => {
      const line = out.trim().split("\n").filter((l) => l.startsWith("{")).at(-1);
      try {
        resolve(line ? (JSON.parse(line) as ChildFigures) : { rows: [], error: `the import child exited with code ${code} and no figures` });
      } catch {
        resolve({ rows: [], error: `unreadable output of the import child: ${out.slice(0, 300)}` });
      }
    });
  });
}

export async function run(): Promise<void> {
  const { solveNetwork } = await import("../lib/engine/network");
  const { prepareBenchActors } = await import("./support/actors");
  const net = sparePanel(TARGET_NODES, "ac");
  const loaded = (net.loads ?? []).length;
  console.log(`bus network on the server — generated panel with spare ways: ${net.nodes.length} nodes, ${net.segments.length} segments, ${loaded} loads, ${net.supplies.length} supplies (AC)`);
  console.log("(a) engine alone: solveNetwork after a JIT warm-up solve of the same panel; (b) the import path in a child process (react-server condition), database of .env.local.");
  solveNetwork(sparePanel(2_000, "ac"));
  const times: number[] = [];
  let dead = 0;
  for (let k = 0; k < SOLVE_RUNS; k++) {
    const t0 = performance.now();
    const r = solveNetwork(net);
    times.push(performance.now() - t0);
    dead = r.results.segments.filter((s) => s.current_A === 0).length;
  }
  console.log("step | ms | peak RSS MB");
  console.log(`(a) solveNetwork, first / best / median of ${SOLVE_RUNS} | ${times[0]!.toFixed(0)} / ${Math.min(...times).toFixed(0)} / ${median(times).toFixed(0)} | ${mb(peakRss())}`);
  console.log(`    segments with exactly 0 A (spare ways): ${dead}`);
  await prepareBenchActors();
  const fig = await runChild();
  for (const [step, ms, rss] of fig.rows) console.log(`(b) ${step} | ${ms} | ${rss}`);
  if (fig.error) console.log(`(b) import path failed: ${fig.error}`);
}

if (process.argv.includes("--child")) void child();
else if (process.argv[1] && process.argv[1].endsWith("network-server.ts")) void run();
