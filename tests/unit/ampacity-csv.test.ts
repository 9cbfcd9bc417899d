import { describe, expect, it } from "vitest";
import { AMPACITY_TABLE_MAX_ROWS, formatCsvIssue, parseAmpacityCsvDetailed, parseTableNumber, splitCsv } from "@/lib/engine/ampacity-table";
import { AMPACITY_FILE_MAX_BYTES, checkAmpacityFile } from "@/lib/ampacity/upload";
import { AMPACITY_TEMPLATE_CSV } from "@/lib/ampacity/template";
import { KCMIL_MM2, awgToArea_m2 } from "@/lib/engine/units";

const HEADER = "size (mm2),label,material,insulation,installation method,reference ambient (C),conductor max (C),amps";
const bytes = (s: string) => new TextEncoder().encode(s);

describe("reading an ampacity table CSV", () => {
  it("reads the canonical header, converting mm² to m²", () => {
    const r = parseAmpacityCsvDetailed(`${HEADER}\n95,95 mm²,copper,xlpe,E,30,90,298\n120,,copper,xlpe,E,30,90,346\n`);
    expect(r.errors).toEqual([]);
    expect(r.rows).toHaveLength(2);
    expect(r.rows[0]).toMatchObject({ size_m2: 95e-6, label: "95 mm²", material: "copper", insulation: "xlpe", installation: "E", referenceAmbient_C: 30, conductorMax_C: 90, ampacity_A: 298 });
    expect(r.rows[1]!.label).toBeUndefined();
  });

  it("strips a byte-order mark, reads CRLF, comments and columns in any order", () => {
    const csv = "\uFEFF# a comment\r\namps;installation;insulation;material;ambient (°C);size (mm²)\r\n298;E;xlpe;Cu;30;95\r\n";
    const r = parseAmpacityCsvDetailed(csv);
    expect(r.errors).toEqual([]);
    expect(r.rows[0]).toMatchObject({ size_m2: 95e-6, material: "copper", ampacity_A: 298, conductorMax_C: 90 });
    expect(r.notes).toContain("Separator: semicolon");
  });

  it("reads decimal commas with semicolons, and quoted with commas", () => {
    const semi = parseAmpacityCsvDetailed("size (mm2);material;insulation;installation;reference ambient (C);amps\n1,5;copper;pvc;C;30;19,5\n");
    expect(semi.errors).toEqual([]);
    expect(semi.rows[0]!.size_m2).toBeCloseTo(1.5e-6, 15);
    expect(semi.rows[0]!.ampacity_A).toBe(19.5);
    const comma = parseAmpacityCsvDetailed('size (mm2),material,insulation,installation,reference ambient (C),amps\n"1,5",copper,pvc,C,30,"19,5"\n');
    expect(comma.errors).toEqual([]);
    expect(comma.rows[0]!.ampacity_A).toBe(19.5);
  });

  it("an unquoted decimal comma with comma separators is reported with a hint", () => {
    const r = parseAmpacityCsvDetailed("size (mm2),material,insulation,installation,reference ambient (C),amps\n1,5,copper,pvc,C,30,19\n");
    expect(r.rows).toEqual([]);
    expect(r.errors.map(formatCsvIssue).join("\n")).toMatch(/7 values but the header has 6 columns \(a decimal comma splits a value/);
  });

  it("kcmil, AWG and mixed AWG/kcmil size columns; °F ambient converted to °C", () => {
    const r = parseAmpacityCsvDetailed("size (AWG/kcmil),material,insulation,installation,ambient (°F),amps\n4/0,copper,thhn,conduit,86,260\n250,copper,thhn,conduit,86,290\n12,copper,thhn,conduit,86,30\n");
    expect(r.errors).toEqual([]);
    expect(r.rows[0]!.size_m2).toBeCloseTo(awgToArea_m2("4/0"), 15);
    expect(r.rows[1]!.size_m2).toBeCloseTo(250 * KCMIL_MM2 * 1e-6, 15);
    expect(r.rows[2]!.size_m2).toBeCloseTo(awgToArea_m2("12"), 15);
    expect(r.rows[0]!.referenceAmbient_C).toBeCloseTo(30, 12);
    expect(r.rows[0]!.conductorMax_C).toBe(90);
    const k = parseAmpacityCsvDetailed("size (kcmil),material,insulation,installation,ambient (F),amps\n500,aluminum,xhhw,tray,86,310\n");
    expect(k.errors).toEqual([]);
    expect(k.rows[0]!.material).toBe("aluminium");
  });

  it("a header without units is refused, saying which unit to add", () => {
    const r = parseAmpacityCsvDetailed("size,material,insulation,installation,ambient,amps\n95,copper,xlpe,E,30,298\n");
    const text = r.errors.map(formatCsvIssue).join("\n");
    expect(text).toMatch(/Column "size" does not say its unit: write "size \(mm2\)"/);
    expect(text).toMatch(/Column "ambient" does not say its unit: add \(°C\) or \(°F\)/);
    expect(r.rows).toEqual([]);
  });

  it("missing and unknown columns are each named", () => {
    const r = parseAmpacityCsvDetailed("size (mm2),material,colour,amps\n95,copper,red,298\n");
    const text = r.errors.map(formatCsvIssue).join("\n");
    expect(text).toMatch(/Column "colour" is not one Ohmstead reads/);
    expect(text).toMatch(/The insulation column is missing/);
    expect(text).toMatch(/The installation method column is missing/);
    expect(text).toMatch(/The reference ambient column is missing/);
  });

  it("lists every bad row with its line and column, and keeps no rows", () => {
    const csv = [HEADER, "95,,copper,xlpe,E,30,90,298", "120,,brass,xlpe,E,30,90,346", "150,,copper,xlpe,E,30,90,-5", "185,,copper,silk,E,30,90,450", "240,,copper,xlpe,,30,90,abc"].join("\n");
    const r = parseAmpacityCsvDetailed(csv);
    expect(r.rows).toEqual([]);
    const lines = r.errors.map(formatCsvIssue);
    expect(lines).toContain('Line 3, column "material": Material "brass" is not copper or aluminium (Cu, Al and aluminum are read too)');
    expect(lines.find((l) => l.startsWith("Line 4, column \"amps\""))).toMatch(/Ampacity must be greater than 0/);
    expect(lines.find((l) => l.startsWith("Line 5, column \"insulation\""))).toMatch(/"silk" is not one of pvc, xlpe/);
    expect(lines).toContain('Line 6, column "installation method": Installation method is empty');
    expect(lines).toContain('Line 6, column "amps": Amps "abc" is not a number');
    expect(r.errors).toHaveLength(5);
  });

  it("a duplicate key (size, material, insulation, installation) is an error naming the first line", () => {
    const r = parseAmpacityCsvDetailed([HEADER, "95,,copper,xlpe,E,30,90,298", "120,,copper,xlpe,E,30,90,346", "95,,Cu,XLPE,e,30,90,300"].join("\n"));
    expect(r.rows).toEqual([]);
    expect(r.errors.map(formatCsvIssue)).toEqual([expect.stringMatching(/^Line 4: Duplicate row: line 2 has the same size, material, insulation and installation method/)]);
    // Same size under another installation method is not a duplicate.
    expect(parseAmpacityCsvDetailed([HEADER, "95,,copper,xlpe,E,30,90,298", "95,,copper,xlpe,F,30,90,328"].join("\n")).errors).toEqual([]);
  });

  it("insulation 'other' needs the maximum-temperature column", () => {
    const r = parseAmpacityCsvDetailed("size (mm2),material,insulation,installation,ambient (C),amps\n95,copper,other,E,30,298\n");
    expect(r.errors[0]!.message).toMatch(/Insulation "other" needs a conductor maximum temperature column/);
  });

  it("a reference ambient at or above the conductor maximum is refused", () => {
    const r = parseAmpacityCsvDetailed(`${HEADER}\n95,,copper,rubber-60,E,60,60,200\n`);
    expect(r.errors[0]!.message).toMatch(/Reference ambient 60 °C is not below the conductor maximum 60 °C/);
  });

  it("empty file, header only, and too many rows", () => {
    expect(parseAmpacityCsvDetailed("").errors[0]!.message).toMatch(/empty/);
    expect(parseAmpacityCsvDetailed(`${HEADER}\n`).errors[0]!.message).toMatch(/header but no rows/);
    const many = [HEADER, ...Array.from({ length: AMPACITY_TABLE_MAX_ROWS + 1 }, (_, i) => `${i + 1},,copper,xlpe,E,30,90,${i + 10}`)].join("\n");
    const r = parseAmpacityCsvDetailed(many);
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]!.message).toBe(`The file has ${AMPACITY_TABLE_MAX_ROWS + 1} rows; a table may have at most ${AMPACITY_TABLE_MAX_ROWS}`);
  });

  it("quoted fields may hold separators, quotes and line breaks; line numbers follow the file", () => {
    const recs = splitCsv('a,b\n"x, ""y""",z\n"two\nlines",w\n\nlast,1', ",");
    expect(recs.map((r) => r.cells)).toEqual([["a", "b"], ['x, "y"', "z"], ["two\nlines", "w"], ["last", "1"]]);
    expect(recs.map((r) => r.line)).toEqual([1, 2, 3, 6]);
  });

  it("numbers: spaces as digit groups, a lone decimal comma, nothing else", () => {
    expect(parseTableNumber(" 1 250 ")).toBe(1250);
    expect(parseTableNumber("19,5")).toBe(19.5);
    expect(parseTableNumber("1.5e2")).toBe(150);
    expect(parseTableNumber("1,000,5")).toBeNaN();
    expect(parseTableNumber("12A")).toBeNaN();
  });
});

describe("checking an uploaded file", () => {
  it("refuses a file over 2 MB, naming the limit", () => {
    const big = new Uint8Array(AMPACITY_FILE_MAX_BYTES + 1).fill(0x20);
    const v = checkAmpacityFile(big, "big.csv");
    expect(v.ok).toBe(false);
    if (!v.ok) expect(v.message).toMatch(/at most 2 MB/);
  });

  it("refuses text that is not UTF-8 and files that are not CSV", () => {
    const latin1 = new Uint8Array([...bytes(`${HEADER}\n95,`), 0xb2, ...bytes(",copper,xlpe,E,30,90,298\n")]);
    const v = checkAmpacityFile(latin1, "t.csv");
    expect(!v.ok && v.message).toMatch(/not UTF-8 text/);
    const x = checkAmpacityFile(bytes("x"), "table.xlsx");
    expect(!x.ok && x.message).toMatch(/not a CSV file/);
  });

  it("a bad row refuses the whole table and says why", () => {
    const v = checkAmpacityFile(bytes(`${HEADER}\n95,,copper,xlpe,E,30,90,298\n120,,copper,xlpe,E,30,90,\n`), "t.csv");
    expect(v.ok).toBe(false);
    if (!v.ok) {
      expect(v.message).toMatch(/a code table must be complete/);
      expect(v.errors.map(formatCsvIssue)).toEqual(['Line 3, column "amps": Amps is empty']);
    }
  });

  it("the downloadable template is read by the same parser: its only complaint is that it has no rows", () => {
    const r = parseAmpacityCsvDetailed(AMPACITY_TEMPLATE_CSV);
    expect(r.errors.map((e) => e.message)).toEqual(["The table has a header but no rows"]);
    const filled = AMPACITY_TEMPLATE_CSV + "2.5,2.5 mm²,copper,pvc,E,30,70,24\r\n";
    expect(parseAmpacityCsvDetailed(filled).errors).toEqual([]);
  });
});

describe("the table snapshot in a sheet PDF's inputs", () => {
  it("prints as one readable line, not as rows", async () => {
    const { ampacityTableLine, inputsSection } = await import("@/lib/pdf/sections");
    const snapshot = { table: { id: 4, name: "Site code", version: 3, source: "Illustrative", rows: [{ size_m2: 95e-6 }, { size_m2: 120e-6 }] }, installation: "E", insulation: "xlpe", groupingArrangement: "bunched", circuits: 3 };
    expect(ampacityTableLine(snapshot)).toBe("Ampacity table: Site code v3 (installation E, XLPE, 3 circuits bunched); 2 rows of it kept with this sheet. Source: Illustrative.");
    expect(ampacityTableLine(undefined)).toBeNull();
    const nodes = JSON.stringify(inputsSection("voltage-drop", { current_A: 10, ampacityFromTable: snapshot }, "metric"));
    expect(nodes).toContain("Ampacity table: Site code v3");
    expect(nodes).not.toMatch(/size_m2|Size m2|› rows|rows ›/i);
  });
});
