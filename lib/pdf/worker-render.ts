import path from "node:path";
import { Worker } from "node:worker_threads";
import { font } from "./styles";
import { h, type PdfNode } from "./tree";

/**
 * Renders PDF trees in one long-lived worker thread (lib/pdf/render-worker.mjs, plain
 * ESM that needs no TypeScript loader), so the main thread stays free for other
 * requests while a package of many sheets is laid out, and fonts are parsed once (the
 * worker starts reading them as it starts).
 * Jobs queue in the worker one after another. The entry is located from the working
 * directory (the app's root, where `next start` runs). The worker is unref'd: it never
 * keeps the process alive; if it dies, the next job starts a new one.
 */
type Reply = { id: number; pdf?: ArrayBuffer; marks?: Record<string, number>; refs?: Record<string, string>; error?: string };
export interface WorkerRender {
  pdf: Buffer;
  /** The page each Mark landed on. */
  marks: Record<string, number>;
  /** What each PageRef printed. */
  refs: Record<string, string>;
}
type Pending = { resolve: (v: WorkerRender) => void; reject: (e: Error) => void };

/**
 * The worker's old-generation heap cap. A 50-sheet package needs well under it; without
 * a cap V8 lets garbage pile up to several hundred MB before collecting (measured: peak
 * process RSS 913 MB uncapped).
 */
const WORKER_OLD_SPACE_MB = 320;

let worker: Worker | null = null;
let nextId = 1;
const pending = new Map<number, Pending>();

export function workerEntry(root = process.cwd()): string {
  return path.join(root, "lib", "pdf", "render-worker.mjs");
}

function failAll(err: Error) {
  for (const p of pending.values()) p.reject(err);
  pending.clear();
  worker = null;
}

function getWorker(root: string): Worker {
  if (worker) return worker;
  // Constructed indirectly: the bundler rewrites a literal `new Worker(…)` into its own
  // module loading, but this entry is a plain ESM file loaded by Node at run time.
  const w = Reflect.construct(Worker, [workerEntry(root), { workerData: { root }, resourceLimits: { maxOldGenerationSizeMb: WORKER_OLD_SPACE_MB } }]) as Worker;
  w.unref();
  w.on("message", (m: Reply) => {
    const p = pending.get(m.id);
    if (!p) return;
    pending.delete(m.id);
    if (m.error || !m.pdf) p.reject(new Error(`PDF worker failed: ${m.error ?? "no output"}`));
    else p.resolve({ pdf: Buffer.from(m.pdf), marks: m.marks ?? {}, refs: m.refs ?? {} });
  });
  w.on("error", (err) => failAll(err instanceof Error ? err : new Error(String(err))));
  w.on("exit", (code) => {
    if (worker === w) failAll(new Error(`PDF worker stopped (exit code ${code})`));
  });
  worker = w;
  return w;
}

export function renderInWorker(tree: PdfNode, root = process.cwd()): Promise<WorkerRender> {
  return new Promise((resolve, reject) => {
    const id = nextId++;
    pending.set(id, { resolve, reject });
    getWorker(root).postMessage({ id, tree, root });
  });
}

/** Stops the worker (tests and benchmarks that want a clean exit or a cold start). */
export async function stopPdfWorker(): Promise<void> {
  const w = worker;
  worker = null;
  if (w) await w.terminate();
}

/**
 * Starts the worker and lays out one small page in each font weight, so the first
 * package after a server start does not also pay for loading react-pdf, parsing the
 * fonts and compiling the layout code (measured: the first package took about twice as
 * long as the next ones). Failures are logged only: the next real job starts afresh.
 */
export async function warmPdfWorker(root = process.cwd()): Promise<void> {
  const line = (style: Record<string, unknown>) => h("Text", { style }, "Ohmstead warm-up 0123456789 Ω·m² °C");
  const doc = h(
    "Document",
    { title: "warm-up" },
    h(
      "Page",
      { size: "A4", style: { fontFamily: font.sans, fontSize: 9, padding: 36 } },
      [400, 500, 600, 700].map((fontWeight) => line({ fontWeight })),
      line({ fontFamily: font.mono }),
      line({ fontFamily: font.mono, fontWeight: 700 }),
    ),
  );
  await renderInWorker(doc, root);
}
