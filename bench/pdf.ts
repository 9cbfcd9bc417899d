/**
 * PDF rendering: one sheet (main thread, as the sheet route does), a 50-sheet package
 * (in the worker thread, as the package route does: renderPackage) and, for scale, 50
 * minimal pages with the same library. Reports wall time, the longest stall of the main
 * thread's event loop while rendering, and the process's peak RSS (worker included).
 * One sheet: the first rendering after start, then the median and 95th percentile of
 * repeated renderings (the same sheet, and a run of different sheets, whose numbers and
 * names are new each time), with the main thread's own CPU time beside the wall time:
 * on a shared machine the wall time also counts the other processes' turns.
 * Goals: one sheet ≤ 300 ms, package ≤ 10 s, peak memory ≤ 800 MB.
 */
import { readFileSync } from "node:fs";
import { CALC_EXAMPLES } from "../app/api/v1/calc/examples";
import { CALC_KINDS, isCalcKind, runCalc } from "../lib/engine";
import { packageDocument, type PackageInfo } from "../lib/pdf/package-pages";
import { renderPackage } from "../lib/pdf/package-render";
import { renderTree, renderTreeWithMarks } from "../lib/pdf/render-core.mjs";
import { sheetDocument } from "../lib/pdf/sheet-pages";
import { h } from "../lib/pdf/tree";
import type { SheetPdfData } from "../lib/pdf/types";
import { verificationCode } from "../lib/pdf/verification-code";
import { renderInWorker, stopPdfWorker } from "../lib/pdf/worker-render";
import { loadLine, quantile } from "./support/stats";

const KINDS = ["busbar-rating", "voltage-drop", "enclosure-heat", "parallel-sharing", "fault-withstand"] as const;
type Kind = (typeof KINDS)[number];
const organisation = { name: "Fenwick Panelworks", logo: null };
const project = { code: "FPW-300", name: "Bench substation switchboard", client: "Estuary Water Trust", site: "Quay Road", unitSystem: "metric" as const };
const RUNS = 25;

function sheetData(i: number, kind: Kind, approved: boolean, inputs: Record<string, unknown> = CALC_EXAMPLES[kind]): SheetPdfData {
  const hash = (i + 1).toString(16).padStart(64, "a");
  const code = verificationCode(hash, 1000 + i, 0);
  const computed = runCalc(kind, inputs);
  return {
    organisation,
    project,
    sheet: { id: 1000 + i, tag: `S-${String(i + 1).padStart(2, "0")}`, title: `Sheet ${i + 1} of the bench package`, kind, kindTitle: isCalcKind(kind) ? CALC_KINDS[kind].title : kind },
    revision: {
      ordinal: 0,
      label: "A",
      status: approved ? "approved" : "draft",
      authorName: "Ada Marlowe",
      checkedByName: approved ? "Tobias Wren" : null,
      createdAt: new Date("2026-11-20T09:00:00Z"),
      submittedAt: new Date("2026-11-21T09:00:00Z"),
      decidedAt: approved ? new Date("2026-11-22T09:00:00Z") : null,
      engineVersion: "1.0.0",
      contentHash: hash,
      inputs,
      results: computed.ok ? computed.result : null,
    },
    verification: approved ? { code, url: `http://127.0.0.1:3000/verify/${code}` } : null,
  };
}

/** The package's i-th sheet: the five kinds in turn, one in seven a draft. */
const packageSheet = (i: number) => sheetData(i, KINDS[i % KINDS.length]!, i % 7 !== 3);

/** CPU time this thread has spent running (Linux), in ms; null where it cannot be read. */
function threadCpuMs(): number | null {
  try {
    return Number(readFileSync(`/proc/self/task/${process.pid}/schedstat`, "utf8").split(" ")[0]) / 1e6;
  } catch {
    return null;
  }
}

/** Samples RSS and the event loop's lag while `body` runs. */
async function measure<T>(label: string, body: () => Promise<T>): Promise<T> {
  let peak = process.memoryUsage().rss;
  let maxLag = 0;
  let last = performance.now();
  const timer = setInterval(() => {
    const now = performance.now();
    maxLag = Math.max(maxLag, now - last - 10);
    last = now;
    peak = Math.max(peak, process.memoryUsage().rss);
  }, 10);
  const t0 = performance.now();
  const out = await body();
  const ms = performance.now() - t0;
  // A render that blocks the thread holds the timer back: the gap since its last tick counts too.
  maxLag = Math.max(maxLag, performance.now() - last - 10);
  clearInterval(timer);
  peak = Math.max(peak, process.memoryUsage().rss);
  console.log(`${label.padEnd(52)} ${ms.toFixed(0).padStart(6)} ms   longest main-thread stall ${maxLag.toFixed(0).padStart(5)} ms   peak RSS ${(peak / 2 ** 20).toFixed(0)} MB`);
  return out;
}

/** Renders each document in turn; prints the median and 95th percentile of wall and thread CPU time. */
async function series(label: string, docs: () => ReturnType<typeof sheetDocument>, runs = RUNS): Promise<void> {
  const wall: number[] = [];
  const cpu: number[] = [];
  for (let i = 0; i < runs; i++) {
    const doc = docs();
    const c0 = threadCpuMs();
    const t0 = performance.now();
    await renderTree(doc);
    wall.push(performance.now() - t0);
    const c1 = threadCpuMs();
    if (c0 !== null && c1 !== null) cpu.push(c1 - c0);
  }
  const f = (v: number) => v.toFixed(0).padStart(4);
  const cpuText = cpu.length ? `   main-thread CPU median ${f(quantile(cpu, 0.5))} ms, p95 ${f(quantile(cpu, 0.95))} ms` : "";
  console.log(`${label.padEnd(52)} median ${f(quantile(wall, 0.5))} ms, p95 ${f(quantile(wall, 0.95))} ms (${runs} runs)${cpuText}`);
}

export async function run(): Promise<void> {
  console.log(loadLine());
  const busbar = sheetData(0, "busbar-rating", true);
  const first = await measure("one sheet PDF (busbar rating, first after start)", () => renderTree(sheetDocument(busbar)));
  console.log(`  ${first.length} bytes`);
  await series("one sheet PDF, busbar rating approved", () => sheetDocument(busbar));
  const vd = sheetData(1, "voltage-drop", true);
  await series("one sheet PDF, voltage drop approved", () => sheetDocument(vd));
  const fw = sheetData(2, "fault-withstand", true);
  await series("one sheet PDF, fault withstand approved", () => sheetDocument(fw));
  // Different sheets each time (tag, hash, code, current and so every result): nothing but
  // the fixed wording repeats from one rendering to the next.
  let n = 100;
  const base = CALC_EXAMPLES["busbar-rating"] as Record<string, unknown>;
  await series("one sheet PDF, busbar rating, a new sheet each run", () => {
    n++;
    return sheetDocument(sheetData(n, "busbar-rating", true, { ...base, current_A: 400 + 7 * n }));
  });
  await measure("one sheet PDF (busbar rating, main thread, warm)", () => renderTree(sheetDocument(busbar)));

  const minimal = h("Document", null, Array.from({ length: 50 }, (_, i) => h("Page", { size: "A4", style: { fontFamily: "Plex Sans", padding: 40 } }, h("Text", null, `Page ${i + 1}`))));
  await measure("50 minimal pages (same library, main thread)", () => renderTree(minimal));

  const info: PackageInfo = { organisation, project, label: "P1", issuedAt: new Date(), issuedBy: "Tobias Wren", includesDrafts: true, sheets: Array.from({ length: 50 }, (_, i) => packageSheet(i)) };
  await renderInWorker(minimal); // worker start-up, as after the first package of a server's life
  const pkg = await measure("50-sheet package (worker thread, as issued)", () => renderPackage(info));
  const pages = (pkg.pdf.toString("latin1").match(/\/Type \/Page\b/g) ?? []).length;
  console.log(`  ${pages} pages, ${(pkg.pdf.length / 1024).toFixed(0)} KB; index marks ${Object.keys(pkg.pages).length}; ${pkg.passes} rendering pass${pkg.passes === 1 ? "" : "es"}`);
  // For scale only (the application never renders a package here): the worker is stopped
  // first, so the peak below is this thread's rendering and not the worker's heap as well.
  await stopPdfWorker();
  await measure("50-sheet package, one pass in the main thread", () => renderTreeWithMarks(packageDocument(info, null)));
  console.log(loadLine());
}
