import { execFileSync } from "node:child_process";
import { mkdtempSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { createElement as el, type ReactElement } from "react";
import * as RP from "@react-pdf/renderer";
import { describe, expect, it } from "vitest";
import { loadFonts, renderTree, renderTreeWithMarks, toInstance } from "@/lib/pdf/render-core.mjs";
import { h, text, view, type PdfNode } from "@/lib/pdf/tree";

// The renderer sets page numbers and page references after one layout (render-core.mjs);
// these tests hold it to react-pdf's own page numbering and to where things really land,
// read back from the PDF with poppler's pdftotext.
const OUT = mkdtempSync(path.join(tmpdir(), "ohm-render-core-"));
let seq = 0;
function save(pdf: Buffer): string {
  const file = path.join(OUT, `${++seq}.pdf`);
  writeFileSync(file, pdf);
  return file;
}
const pageText = (file: string, page: number) => execFileSync("pdftotext", ["-f", String(page), "-l", String(page), "-layout", file, "-"], { encoding: "utf8" });
const pageCount = (file: string) => Number(/Pages:\s+(\d+)/.exec(execFileSync("pdfinfo", [file], { encoding: "utf8" }))?.[1]);
/** The bytes without what differs between two renderings of the same document (creation time, file id). */
const normalised = (pdf: Buffer) =>
  pdf
    .toString("latin1")
    .replace(/\(D:\d+Z\)/g, "(D:)")
    .replace(/\/ID \[<[0-9a-f]+> <[0-9a-f]+>\]/g, "/ID []");

const PAGE_STYLE = { fontFamily: "Plex Sans", fontSize: 9, paddingTop: 90, paddingBottom: 60, paddingHorizontal: 36, lineHeight: 1.35 };
const NUMBER_STYLE = { position: "absolute", top: 40, right: 36, fontSize: 8.5, fontWeight: 500 };
const para = (i: number) => `Paragraph ${i}: the feeder runs ${(12.5 * i).toFixed(1)} m along the cable ladder to the pump motor starter, with the drop checked against the limit.`;

/** A sheet-like page: a fixed header, a page number, body text with indices, a box that does not split. */
function longPage(paragraphs: number, numberStyle: Record<string, unknown> = NUMBER_STYLE): PdfNode {
  return h(
    "Page",
    { size: "A4", style: PAGE_STYLE },
    h("View", { fixed: true, style: { position: "absolute", top: 30, left: 36, right: 36, height: 40, borderWidth: 0.75, borderColor: "#333333" } }, text({ fontSize: 11, fontWeight: 700, margin: 6 }, "FPW-210  BR-01")),
    h("PageNo", { fixed: true, template: "Page {page} of {pages}", style: numberStyle }),
    Array.from({ length: paragraphs }, (_, i) =>
      i % 9 === 4
        ? h("View", { wrap: false, style: { borderWidth: 0.5, borderColor: "#999999", padding: 4, marginVertical: 4 } }, text({ fontWeight: 600 }, `Check ${i}`), text({}, "R", h("Text", { style: { fontSize: 6, verticalAlign: "sub" } }, "ac"), " = 12.3 µΩ/m"))
        : text({ marginBottom: 3 }, para(i)),
    ),
  );
}

/** The same page as React elements, numbered by react-pdf itself (a render prop). */
function longPageReact(paragraphs: number): ReactElement {
  return el(
    RP.Page,
    { size: "A4", style: PAGE_STYLE },
    el(RP.View, { fixed: true, style: { position: "absolute", top: 30, left: 36, right: 36, height: 40, borderWidth: 0.75, borderColor: "#333333" } }, el(RP.Text, { style: { fontSize: 11, fontWeight: 700, margin: 6 } }, "FPW-210  BR-01")),
    el(RP.Text, { fixed: true, style: NUMBER_STYLE as never, render: ({ pageNumber, totalPages }: { pageNumber: number; totalPages: number }) => `Page ${pageNumber} of ${totalPages}` }),
    ...Array.from({ length: paragraphs }, (_, i) =>
      i % 9 === 4
        ? el(RP.View, { key: i, wrap: false, style: { borderWidth: 0.5, borderColor: "#999999", padding: 4, marginVertical: 4 } }, el(RP.Text, { style: { fontWeight: 600 } }, `Check ${i}`), el(RP.Text, { style: {} }, "R", el(RP.Text, { style: { fontSize: 6, verticalAlign: "sub" } }, "ac"), " = 12.3 µΩ/m"))
        : el(RP.Text, { key: i, style: { marginBottom: 3 } }, para(i)),
    ),
  );
}

describe("PDF renderer: page numbers set after one layout", () => {
  it("prints the same document, byte for byte, as react-pdf numbering its own pages", async () => {
    await loadFonts();
    const tree = h("Document", { title: "Numbering", creator: "Ohmstead", producer: "Ohmstead" }, longPage(150), longPage(20));
    const ours = await renderTree(tree);
    const theirs = await RP.renderToBuffer(el(RP.Document, { title: "Numbering", creator: "Ohmstead", producer: "Ohmstead" }, longPageReact(150), longPageReact(20)));
    const file = save(ours);
    const pages = pageCount(file);
    expect(pages).toBeGreaterThanOrEqual(4);
    expect(normalised(ours)).toBe(normalised(theirs));
  });

  it("numbers every page of a document of several pages, across its page elements", async () => {
    const file = save(await renderTree(h("Document", null, longPage(150), longPage(20))));
    const pages = pageCount(file);
    expect(pages).toBeGreaterThanOrEqual(4);
    for (let p = 1; p <= pages; p++) {
      const t = pageText(file, p);
      expect(t).toContain(`Page ${p} of ${pages}`);
      expect(t).toContain("FPW-210");
      expect(t.match(/Page \d+ of \d+/g)).toHaveLength(1);
    }
  });

  it("records where each mark lands and prints it at each page reference, in one rendering", async () => {
    const ref = (id: string, label: string) =>
      h("View", { style: { flexDirection: "row" } }, text({ width: 200 }, label), h("View", { style: { width: 50 } }, text({}, " "), h("PageRef", { id, style: { position: "absolute", top: 0, left: 0, width: 50, textAlign: "right" } })));
    const index = h("Page", { size: "A4", style: PAGE_STYLE }, text({ fontWeight: 700 }, "Index"), ref("first", "First section"), ref("second", "Second section"), ref("missing", "Nowhere"));
    const first = h("Page", { size: "A4", style: PAGE_STYLE }, Array.from({ length: 70 }, (_, i) => text({}, para(i))), h("Mark", { id: "first" }), text({ fontWeight: 700 }, "FIRST SECTION STARTS HERE"), Array.from({ length: 10 }, (_, i) => text({}, para(i))));
    const second = h("Page", { size: "A4", style: PAGE_STYLE }, h("Mark", { id: "second" }), text({ fontWeight: 700 }, "SECOND SECTION STARTS HERE"));
    const { pdf, marks, refs } = await renderTreeWithMarks(h("Document", null, index, first, second));
    const file = save(pdf);
    const pages = pageCount(file);
    const landed = (words: string) => Array.from({ length: pages }, (_, i) => i + 1).find((p) => pageText(file, p).includes(words));
    expect(marks.first).toBe(landed("FIRST SECTION STARTS HERE"));
    expect(marks.first).toBeGreaterThan(2);
    expect(marks.second).toBe(landed("SECOND SECTION STARTS HERE"));
    expect(marks.second).toBe(pages);
    expect(refs).toEqual({ first: String(marks.first), second: String(marks.second), missing: "—" });
    const indexText = pageText(file, 1);
    expect(indexText).toMatch(new RegExp(`First section\\s+${marks.first}\\b`));
    expect(indexText).toMatch(new RegExp(`Second section\\s+${marks.second}\\b`));
    expect(indexText).toMatch(/Nowhere\s+—/);
  });

  it("refuses a page number or reference in the flow, whose text could move what follows", async () => {
    for (const t of ["PageNo", "PageRef"] as const) {
      const doc = h("Document", null, h("Page", { size: "A4" }, h(t, { id: "x", template: "{page}", style: { fontSize: 9 } })));
      await expect(renderTree(doc)).rejects.toThrow(`A ${t} must be positioned absolutely`);
    }
  });

  it("renders the same bytes again with the shaping cache warm", async () => {
    const tree = h("Document", null, longPage(30));
    const a = await renderTree(tree);
    const b = await renderTree(tree);
    expect(normalised(a)).toBe(normalised(b));
  });
});

describe("PDF renderer: description tree to react-pdf instances", () => {
  it("keeps strings only inside texts, drops empty values, and turns numbers into text", () => {
    const [doc] = toInstance(h("Document", null, h("Page", null, view({ padding: 2 }, "stray", null, false, text({ fontSize: 8 }, "a", 3, "", undefined, h("Text", null, "b"))))));
    const page = doc!.children![0]!;
    const box = page.children![0]!;
    expect(box).toMatchObject({ type: "VIEW", style: { padding: 2 }, props: {} });
    expect(box.children).toHaveLength(1);
    const t = box.children![0]!;
    expect(t.type).toBe("TEXT");
    expect(t.style).toEqual({ fontSize: 8 });
    expect(t.children!.map((c) => c.value ?? c.type)).toEqual(["a", "3", "TEXT"]);
  });

  it("maps a drawing's text to react-pdf's text inside the drawing", () => {
    const [svg] = toInstance(h("Svg", { width: 10, height: 10 }, h("SvgText", { x: 1, y: 2, style: { fontSize: 7 } }, "5 A")));
    expect(svg!.type).toBe("SVG");
    expect(svg!.children![0]).toMatchObject({ type: "TEXT", props: { x: 1, y: 2 }, style: { fontSize: 7 }, children: [{ type: "TEXT_INSTANCE", value: "5 A" }] });
  });
});
