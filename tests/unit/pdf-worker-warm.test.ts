import { afterAll, describe, expect, it } from "vitest";
import { renderInWorker, stopPdfWorker, warmPdfWorker } from "@/lib/pdf/worker-render";
import { h } from "@/lib/pdf/tree";

describe("PDF worker warm-up", () => {
  afterAll(async () => {
    await stopPdfWorker();
  });

  it("lays out a page in the worker, which then renders the next job", async () => {
    await warmPdfWorker();
    const out = await renderInWorker(h("Document", { title: "t" }, h("Page", { size: "A4", style: { fontFamily: "Plex Sans" } }, h("Text", null, "after warm-up"))));
    expect(out.pdf.subarray(0, 5).toString()).toBe("%PDF-");
  }, 60_000);
});
