/**
 * Cable schedule upload: a generated 10 000-row schedule (invented feeders), from the
 * uploaded bytes to the results stored in the database — decoding, header and row
 * validation, the engine for every row, the results hash and the one transaction that
 * stores the file, the schedule and its audit event (lib/schedules/service.ts, the path
 * the server action takes) — next to parsing the same file alone with papaparse.
 * Goal: ≤ 5 s end to end.
 *
 * Each measurement runs in its own child process (node with the react-server condition,
 * as the server modules expect inside Next), so each peak RSS (`maxRSS`) is that of the
 * work measured alone. One warm-up upload of 200 rows, then RUNS timed uploads; the
 * first, best and median wall times are printed. Uses the database of .env.local and the
 * bench organisation; earlier bench schedules of the bench project are removed first.
 */
import { spawn } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { and, eq, inArray } from "drizzle-orm";
import Papa from "papaparse";

const RUNS = 3;
const ROWS = 10_000;
const PROJECT_CODE = "BENCH-SCHEDULE";

/** A schedule of `rows` feeders: sizes, lengths and loads cycle so that some rows fail; every 50th row is invalid. */
export function generatedSchedule(rows: number): string {
  const sizes = [1.5, 2.5, 4, 6, 10, 16, 25, 35, 50, 70, 95, 120, 150, 185, 240];
  const amps = [17.5, 24, 32, 41, 57, 76, 101, 125, 151, 192, 232, 269, 300, 341, 400];
  const lines = ["tag,from,to,material,insulation,size (mm²),number in parallel,length (m),load current (A),power factor,system,voltage (V),ampacity (A),ambient (°C)"];
  let seed = 20261202;
  const rnd = () => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648;
  };
  for (let i = 0; i < rows; i++) {
    const k = Math.floor(rnd() * sizes.length);
    const parallel = k > 11 && rnd() < 0.3 ? 2 : 1;
    const load = (amps[k]! * parallel * (0.4 + 0.7 * rnd())).toFixed(1);
    const pf = i % 50 === 49 ? "1.4" : (0.75 + 0.24 * rnd()).toFixed(2);
    const system = i % 7 === 0 ? "ac-1ph-2w" : "ac-3ph-4w";
    const voltage = system === "ac-1ph-2w" ? "230" : "400";
    lines.push(`F-${String(i + 1).padStart(5, "0")},MSB-${1 + (i % 4)},DB-${i + 1},copper,pvc,${sizes[k]},${parallel},${(5 + 245 * rnd()).toFixed(1)},${load},${pf},${system},${voltage},${amps[k]},${25 + Math.floor(15 * rnd())}`);
  }
  return `${lines.join("\r\n")}\r\n`;
}

const median = (xs: number[]) => [...xs].sort((p, q) => p - q)[Math.floor(xs.length / 2)]!;
const mb = (bytes: number) => (bytes / 2 ** 20).toFixed(0);

interface ChildReport {
  times: number[];
  maxRssKb: number;
  detail: string;
}

/** In the child: papaparse alone, RUNS times. */
function childParse(file: string): ChildReport {
  const text = readFileSync(file, "utf8");
  const times: number[] = [];
  let n = 0;
  for (let i = 0; i < RUNS; i++) {
    const t0 = performance.now();
    n = Papa.parse<string[]>(text, { skipEmptyLines: true }).data.length;
    times.push(performance.now() - t0);
  }
  return { times, maxRssKb: process.resourceUsage().maxRSS, detail: `${n} records` };
}

/** In the child: the upload service, a warm-up then RUNS uploads; each stores its results. */
async function childUpload(file: string, organisationId: number, userId: number, projectId: number): Promise<ChildReport> {
  const { loadEnvFile } = await import("../scripts/load-env");
  loadEnvFile();
  const { uploadSchedule } = await import("../lib/schedules/service");
  const { closeDb } = await import("../db/client");
  const actor = { id: userId, organisationId, role: "engineer" as const, name: "Bench Engineer", email: "bench@ohmstead-bench.example" };
  const data = readFileSync(file);
  const fields = { projectId, limitId: "iec-a-other" };
  try {
    await uploadSchedule(actor, fields, { name: "warm-up.csv", type: "text/csv", data: Buffer.from(generatedSchedule(200)) });
    const times: number[] = [];
    let last = "";
    for (let i = 0; i < RUNS; i++) {
      const t0 = performance.now();
      const r = await uploadSchedule(actor, fields, { name: `bench-${ROWS}.csv`, type: "text/csv", data });
      times.push(performance.now() - t0);
      last = `${r.rowCount} rows, ${r.validCount} computed, ${r.failCount} failing, ${r.errorCount} errors`;
    }
    return { times, maxRssKb: process.resourceUsage().maxRSS, detail: last };
  } finally {
    await closeDb();
  }
}

function runChild(args: string[]): Promise<ChildReport> {
  const self = fileURLToPath(import.meta.url);
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, ["--conditions=react-server", "--import", "tsx", self, "--child", ...args], { cwd: process.cwd(), stdio: ["ignore", "pipe", "inherit"] });
    let out = "";
    child.stdout.on("data", (c: Buffer) => (out += c.toString()));
    child.on("error", reject);
    child.on("exit", (code) => {
      const line = out.trim().split("\n").at(-1) ?? "";
      if (code !== 0 || !line.startsWith("{")) reject(new Error(`bench child ${args[0]} exited ${code}: ${out.slice(-500)}`));
      else resolve(JSON.parse(line) as ChildReport);
    });
  });
}

/** The bench project (created once) with its earlier bench schedules removed. */
async function benchProject(organisationId: number, userId: number): Promise<number> {
  const { loadEnvFile } = await import("../scripts/load-env");
  loadEnvFile();
  const { closeDb, db } = await import("../db/client");
  const { cableSchedules, projects, uploads } = await import("../db/schema");
  try {
    const find = () => db().select({ id: projects.id }).from(projects).where(and(eq(projects.organisationId, organisationId), eq(projects.code, PROJECT_CODE))).limit(1);
    let [p] = await find();
    if (!p) {
      await db()
        .insert(projects)
        .values({ organisationId, code: PROJECT_CODE, name: "Bench cable schedule", systemVoltage: 400, systemType: "3ph-4w", frequency: 50, earthing: "TN-S", designAmbient: 30, standardFamily: "iec", unitSystem: "metric", createdById: userId });
      [p] = await find();
    }
    const projectId = p!.id;
    const old = await db().select({ id: cableSchedules.id, uploadId: cableSchedules.uploadId }).from(cableSchedules).where(and(eq(cableSchedules.organisationId, organisationId), eq(cableSchedules.projectId, projectId)));
    if (old.length) {
      await db().transaction(async (tx) => {
        await tx.delete(cableSchedules).where(and(eq(cableSchedules.organisationId, organisationId), inArray(cableSchedules.id, old.map((o) => o.id))));
        await tx.delete(uploads).where(and(eq(uploads.organisationId, organisationId), inArray(uploads.id, old.map((o) => o.uploadId))));
      });
    }
    return projectId;
  } finally {
    await closeDb();
  }
}

export async function run(): Promise<void> {
  const { prepareBenchActors } = await import("./support/actors");
  const actors = await prepareBenchActors();
  const projectId = await benchProject(actors.organisationId, actors.engineer.id);
  const dir = mkdtempSync(path.join(tmpdir(), "ohm-bench-schedule-"));
  const file = path.join(dir, "schedule.csv");
  const text = generatedSchedule(ROWS);
  writeFileSync(file, text);
  try {
    console.log(`cable schedule — ${ROWS} generated rows, ${(Buffer.byteLength(text) / 1024).toFixed(0)} KB; ${RUNS} runs each, in separate child processes`);
    console.log("what | first ms | best ms | median ms | peak RSS MB | outcome");
    const parse = await runChild(["parse", file]);
    console.log(["papaparse alone (parse only)", parse.times[0]!.toFixed(0), Math.min(...parse.times).toFixed(0), median(parse.times).toFixed(0), mb(parse.maxRssKb * 1024), parse.detail].join(" | "));
    const upload = await runChild(["upload", file, String(actors.organisationId), String(actors.engineer.id), String(projectId)]);
    console.log(["upload → results stored (service)", upload.times[0]!.toFixed(0), Math.min(...upload.times).toFixed(0), median(upload.times).toFixed(0), mb(upload.maxRssKb * 1024), upload.detail].join(" | "));
    const goal = median(upload.times) <= 5000;
    console.log(`goal ≤ 5 s end to end: ${goal ? "met" : "NOT met"} (median ${(median(upload.times) / 1000).toFixed(2)} s); the upload's peak includes node, the database driver and the engine modules.`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

// Child mode: `node --conditions=react-server --import tsx bench/schedule.ts --child <what> …`
const argv = process.argv;
const at = argv.indexOf("--child");
if (at >= 0) {
  const [what, file, org, user, project] = argv.slice(at + 1);
  const job = what === "parse" ? Promise.resolve(childParse(file!)) : childUpload(file!, Number(org), Number(user), Number(project));
  job.then(
    (r) => {
      console.log(JSON.stringify(r));
      process.exit(0);
    },
    (err: unknown) => {
      console.error(err);
      process.exit(1);
    },
  );
}
