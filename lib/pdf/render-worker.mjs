/**
 * Worker-thread entry: renders PDF description trees off the main thread, so a long
 * package does not hold up other requests. Long-lived (fonts stay loaded, their shaped
 * text cached): each message { id, tree, root } is answered with { id, pdf (ArrayBuffer,
 * transferred), marks, refs } or { id, error }, one at a time. The fonts start loading
 * as soon as the worker starts (workerData.root), while the first job is on its way.
 */
import { parentPort, workerData } from "node:worker_threads";
import { loadFonts, renderTreeWithMarks } from "./render-core.mjs";

// A failure here is reported by the first job, which loads the fonts again.
loadFonts(workerData?.root).catch(() => {});

parentPort.on("message", async ({ id, tree, root }) => {
  try {
    const { pdf, marks, refs } = await renderTreeWithMarks(tree, root);
    const bytes = pdf.buffer.slice(pdf.byteOffset, pdf.byteOffset + pdf.byteLength);
    parentPort.postMessage({ id, pdf: bytes, marks, refs }, [bytes]);
  } catch (err) {
    parentPort.postMessage({ id, error: err instanceof Error ? `${err.message}\n${err.stack ?? ""}` : String(err) });
  }
});
