import { describe, expect, it } from "vitest";
import { conductorTemperatureAtLoad, voltageDrop } from "@/lib/engine/voltage-drop";
import { ambientCorrectionFactor, type AmpacityTable } from "@/lib/engine/ampacity-table";
import { awgToArea_m2, kcmilToArea_m2 } from "@/lib/engine/units";
import { parseHeader } from "@/lib/schedules/columns";
import { decodeText, detectSeparator, ScheduleFileError } from "@/lib/schedules/decode";
import { neutraliseCell, resultsCsv, templateCsv } from "@/lib/schedules/export";
import { unneutralise } from "@/lib/schedules/rows";
import { processSchedule } from "@/lib/schedules/schedule";
import { MAX_ROWS, type ScheduleOptions } from "@/lib/schedules/types";
import { scheduleResultsHash } from "@/lib/schedules/hash";
import { canonicalJson, sha256Hex } from "@/lib/hash";

const OPTIONS: ScheduleOptions = { limitId: "iec-a-other", defaultAmbient_C: 30, frequency_Hz: 50 };
const enc = (s: string) => new TextEncoder().encode(s);
const run = (csv: string | Uint8Array, table: AmpacityTable | null = null, options = OPTIONS) =>
  processSchedule({ bytes: typeof csv === "string" ? enc(csv) : csv, options, table, tableLabel: table ? `"${table.name}" v1` : null });

const HEADER = "tag,from,to,material,insulation,size (mm²),number in parallel,length (m),load current (A),power factor,system,voltage (V),ampacity (A),ambient (°C)";
const ROW = "F-1,MSB,DB-1,copper,pvc,25,1,60,80,0.85,ac-3ph-4w,400,101,30";

/** An invented organisation table (values for the tests only). */
const TABLE: AmpacityTable = {
  name: "Workshop table",
  rows: [
    { size_m2: 16e-6, material: "copper", insulation: "pvc", installation: "E", referenceAmbient_C: 30, conductorMax_C: 70, ampacity_A: 80 },
    { size_m2: 25e-6, material: "copper", insulation: "pvc", installation: "E", referenceAmbient_C: 30, conductorMax_C: 70, ampacity_A: 101 },
  ],
};

describe("header", () => {
  it("reads names, aliases and units in () or []", () => {
    const h = parseHeader(["Tag", "material", "insulation", "size [kcmil]", "Length [ft]", "Current (kA)", "system", "Voltage (kV)", "notes"]);
    expect(h.errors).toEqual([]);
    expect(h.columns.find((c) => c.key === "length")?.unit).toBe("ft");
    expect(h.columns.find((c) => c.key === "size")?.unit).toBe("kcmil");
    expect(h.columns.find((c) => c.key === "current")?.unit).toBe("ka");
    expect(h.ignored).toEqual(["notes"]);
  });

  it("refuses an unknown unit, naming the column and the accepted units", () => {
    const h = parseHeader(HEADER.replace("length (m)", "length (furlong)").split(","));
    expect(h.errors.join(" ")).toMatch(/Column "length \(furlong\)": unit "furlong" is not accepted for length; use one of m, mm, cm, km, ft, in, yd, mi/);
  });

  it("names a missing required column and a column given twice", () => {
    expect(parseHeader(["tag", "material"]).errors.join(" ")).toMatch(/no "size" column/);
    expect(parseHeader([...HEADER.split(","), "cable tag"]).errors.join(" ")).toMatch(/both the tag column/);
  });
});

describe("file decoding", () => {
  it("accepts UTF-8 with and without a byte order mark, with the same results", () => {
    const csv = `${HEADER}\n${ROW}\n`;
    const plain = run(csv);
    const bom = run(new Uint8Array([0xef, 0xbb, 0xbf, ...enc(csv)]));
    expect(plain.validCount).toBe(1);
    expect(bom.results).toEqual(plain.results);
    expect(bom.notices.join(" ")).toMatch(/byte order mark/);
  });

  it("refuses UTF-16, a workbook, invalid UTF-8 and an empty file with a plain message", () => {
    expect(() => decodeText(new Uint8Array([0xff, 0xfe, 0x74, 0]))).toThrow(/UTF-16/);
    expect(() => decodeText(new Uint8Array([0x50, 0x4b, 0x03, 0x04, 1, 2]))).toThrow(/spreadsheet workbook/);
    // "°" in Windows-1252 is the single byte 0xB0 — not UTF-8.
    expect(() => decodeText(new Uint8Array([...enc("tag,ambient (\n"), 0xb0, ...enc("C)\n")]))).toThrow(/not valid UTF-8 \(first bad character on line 2\)/);
    expect(() => decodeText(new Uint8Array())).toThrow(ScheduleFileError);
  });

  it("detects semicolons and reads decimal commas only then", () => {
    expect(detectSeparator(HEADER)).toBe(",");
    expect(detectSeparator(HEADER.replaceAll(",", ";"))).toBe(";");
    const semi = `${HEADER.replaceAll(",", ";")}\nF-1;MSB;DB-1;copper;pvc;2,5;1;12,5;10,5;0,9;ac-1ph-2w;230;24;30\n`;
    const r = run(semi);
    expect(r.errors).toEqual([]);
    expect(r.results[0]).toMatchObject({ length_m: 12.5, current_A: 10.5, powerFactor: 0.9 });
    expect(r.results[0]!.size_m2).toBeCloseTo(2.5e-6, 15);
    expect(r.notices[0]).toMatch(/semicolon/);
    // The same decimal comma in a comma file splits the number: the row is refused, saying why.
    const comma = run(`${HEADER}\nF-1,MSB,DB-1,copper,pvc,25,1,"12,5",80,0.85,ac-3ph-4w,400,101,30\nF-2,MSB,DB-1,copper,pvc,25,1,12,5,80,0.85,ac-3ph-4w,400,101,30\n`);
    expect(comma.errors.find((e) => e.row === 2)?.message).toMatch(/Row 2, column "length \(m\)": length \(m\) must be a number/);
    expect(comma.errors.find((e) => e.row === 3)?.message).toMatch(/Row 3 has 15 cells but the header has 14.*decimal comma/);
  });

  it("skips empty lines but keeps the spreadsheet's row numbers", () => {
    const r = run(`\n${HEADER}\n\n${ROW}\n ,, \n${ROW.replace("F-1", "F-2").replace("0.85", "2")}\n\n`);
    expect(r.rowCount).toBe(2);
    expect(r.results.map((x) => x.row)).toEqual([4]);
    expect(r.errors).toEqual([{ row: 6, column: "power factor", message: 'Row 6, column "power factor": power factor must be from 0 to 1.' }]);
  });

  it("refuses a file with no rows and a file over the row limit, naming the limit", () => {
    expect(() => run(`${HEADER}\n\n`)).toThrow(/no feeder rows/);
    const many = [HEADER, ...Array.from({ length: MAX_ROWS + 1 }, () => ROW)].join("\n");
    expect(() => run(many)).toThrow(/20,001 rows; the limit is 20,000 rows/);
  });
});

describe("row validation", () => {
  it("names the row, the column and the range in the header's unit", () => {
    const r = run(`${HEADER.replace("length (m)", "length [ft]")}\n${ROW.replace(",60,", ",400000,")}\n${ROW.replace("copper", "brass")}\n${ROW.replace("ac-3ph-4w", "3-phase")}\n`);
    const byRow = Object.fromEntries(r.errors.map((e) => [e.row, e.message]));
    expect(byRow[2]).toBe('Row 2, column "length [ft]": length [ft] must be greater than 0 and up to 328084 ft.');
    expect(byRow[3]).toMatch(/Row 3, column "material": material must be one of: copper, aluminium; got "brass"/);
    expect(byRow[4]).toMatch(/Row 4, column "system": system must be one of: ac-3ph-4w/);
  });

  it("refuses huge and non-finite numbers without crashing", () => {
    const r = run(`${HEADER}\n${ROW.replace(",80,", ",1e400,")}\n${ROW.replace(",80,", ",99999999999999999999,")}\n${ROW.replace(",400,", ",NaN,")}\n`);
    expect(r.validCount).toBe(0);
    expect(r.errors.map((e) => e.column)).toEqual(["load current (A)", "load current (A)", "voltage (V)"]);
    expect(r.errors[0]!.message).toMatch(/load current \(A\) must be a number from 0 to 100000 A/);
    expect(r.errors[1]!.message).toMatch(/from 0 to 100000 A/);
  });

  it("reads formula-looking cells as text or refuses them as numbers, never evaluates them", () => {
    const r = run(`${HEADER}\n${ROW.replace("F-1", "=HYPERLINK(\"x\")").replace(",MSB,", ",@SUM(A1),")}\n${ROW.replace(",80,", ",=2+3,")}\n`);
    expect(r.results[0]).toMatchObject({ tag: '=HYPERLINK("x")', from: "@SUM(A1)" });
    expect(r.errors[0]!.message).toMatch(/Row 3, column "load current \(A\)".*must be a number/);
  });

  it("converts header units and written sizes to SI", () => {
    const head = "tag,material,insulation,size (kcmil),length [ft],load current (kA),power factor,system,voltage (kV),ampacity (A),ambient (°F)";
    const r = run(`${head}\nA,al,xlpe,250,100,0.2,0.9,3ph-4w,0.48,255,86\nB,cu,xlpe,4/0,100,0.2,0.9,3ph-4w,0.48,260,86\nC,cu,xlpe,95 mm2,100,0.2,0.9,3ph-4w,0.48,260,86\n`);
    expect(r.errors).toEqual([]);
    const [a, b, c] = r.results;
    expect(a!.size_m2).toBeCloseTo(kcmilToArea_m2(250), 12);
    expect(a!.material).toBe("aluminium");
    expect(b!.size_m2).toBeCloseTo(awgToArea_m2("4/0"), 12);
    expect(b!.sizeLabel).toBe("4/0 AWG");
    expect(c!.size_m2).toBeCloseTo(95e-6, 12);
    expect(a!.length_m).toBeCloseTo(30.48, 10);
    expect(a!.current_A).toBeCloseTo(200, 10);
    expect(a!.voltage_V).toBeCloseTo(480, 10);
    expect(a!.ambient_C).toBeCloseTo(30, 10);
  });

  it("requires a power factor for AC only", () => {
    const r = run(`${HEADER}\n${ROW.replace(",0.85,", ",,")}\n${ROW.replace(",0.85,", ",,").replace("ac-3ph-4w", "dc").replace(",400,", ",110,")}\n`);
    expect(r.errors).toHaveLength(1);
    expect(r.errors[0]!.message).toMatch(/power factor is required for an AC system \(0 to 1\)/);
    expect(r.results[0]!.system).toBe("dc-2w");
  });
});

describe("computation", () => {
  it("uses a given ampacity as it is and the engine's temperature and drop", () => {
    const r = run(`${HEADER}\n${ROW}\n`).results[0]!;
    const theta = conductorTemperatureAtLoad(30, 70, 80, 101);
    expect(r.conductorTemperature_C).toBeCloseTo(theta, 12);
    const vd = voltageDrop({ system: "ac-3ph-4w", nominalVoltage_V: 400, current_A: 80, powerFactor: 0.85, length_m: 60, area_m2: 25e-6, materialId: "cu-annealed", temperatureBasis: "given", conductorTemperature_C: theta, frequency_Hz: 50 });
    expect(r.drop_percent).toBeCloseTo(vd.results.drop_percent, 12);
    expect(r.drop_V).toBeCloseTo(vd.results.drop_V, 12);
    expect(r.ampacity_A).toBe(101);
    expect(r.pass).toBe(true);
  });

  it("looks up the table row with the ambient and grouping corrections, times the number in parallel", () => {
    const head = HEADER.replace("ampacity (A)", "installation method") + ",grouping factor";
    const r = run(`${head}\nF-9,MSB,DB,copper,pvc,16,2,30,100,0.9,ac-3ph-4w,400,E,40,0.8\n`, TABLE).results[0]!;
    const ka = ambientCorrectionFactor(70, 40, 30);
    expect(r.ampacitySource).toBe("table");
    expect(r.ampacity_A).toBeCloseTo(80 * ka * 0.8 * 2, 10);
    expect(r.thetaMax_C).toBe(70);
  });

  it("says what is missing when a row has no ampacity, no table row or no table", () => {
    const head = `${HEADER},installation method`;
    const noAmp = `F-1,MSB,DB,copper,pvc,25,1,60,80,0.85,ac-3ph-4w,400,,30,`;
    const r = run(`${head}\n${noAmp}\n${noAmp.replace(/,$/, ",E")}\n${noAmp.replace(",25,", ",35,").replace(/,$/, ",E")}\n`, TABLE);
    expect(r.errors[0]!.message).toMatch(/Row 2: no ampacity: give one in the "ampacity \(A\)" column, or fill "installation method"/);
    expect(r.results.map((x) => x.row)).toEqual([3]);
    expect(r.errors[1]!.message).toMatch(/Row 4, column "installation method": table "Workshop table" v1 has no row for 35 mm²/);
    const none = run(`${head}\n${noAmp.replace(/,$/, ",E")}\n`);
    expect(none.errors[0]!.message).toMatch(/no ampacity table was chosen for this upload/);
  });

  it("fails a row over its ampacity or its drop limit, with the reasons", () => {
    const r = run(`${HEADER}\n${ROW.replace(",80,", ",120,")}\n${ROW.replace(",60,", ",400,")}\n`);
    expect(r.failCount).toBe(2);
    expect(r.results[0]!.reasons.join(" ")).toMatch(/Load 120 A exceeds the ampacity 101 A/);
    expect(r.results[0]!.reasons.join(" ")).toMatch(/Conductor temperature .* exceeds the 70 °C limit/);
    expect(r.results[1]!.reasons.join(" ")).toMatch(/Voltage drop .* exceeds the 5\.5 % limit/);
  });
});

describe("CSV export", () => {
  it("neutralises cells that begin with =, +, -, @, tab or CR", () => {
    for (const c of ["=1+1", "+1", "-1", "@A", "\tx", "\rx"]) expect(neutraliseCell(c)).toBe(`'${c}`);
    expect(neutraliseCell("F-1")).toBe("F-1");
    expect(unneutralise("'-40")).toBe("-40");
    expect(unneutralise("'abc")).toBe("'abc");
  });

  it("re-imports its own export to the same values", () => {
    const head = `${HEADER.replace("length (m)", "length [ft]")},installation method,grouping factor`;
    const csv = `${head}\n=CMD|x,@home,+west,copper,pvc,16,2,150,100,0.9,ac-3ph-4w,400,,-10,E,0.9\n-W12,MSB,DB,aluminium,xlpe,4/0,1,80,60,0.8,ac-1ph-2w,230,150,,,\n`;
    const first = run(csv, TABLE);
    expect(first.errors).toEqual([]);
    const exported = resultsCsv(first.results);
    // Neutralised cells are also quoted, so a spreadsheet shows them as text.
    expect(exported.split("\r\n")[1]).toMatch(/^"'=CMD\|x","'@home","'\+west",/);
    expect(exported).toContain(`,"'-10",`);
    const again = run(exported, TABLE);
    expect(again.errors).toEqual([]);
    expect(again.notices.join(" ")).toMatch(/Columns not used \(ignored\): "ambient used \(°C\)"/);
    expect(again.results.length).toBe(first.results.length);
    again.results.forEach((r, i) => {
      const f = first.results[i]!;
      expect(r.tag).toBe(f.tag);
      expect(r.from).toBe(f.from);
      for (const k of ["size_m2", "length_m", "current_A", "ambient_C", "ampacity_A", "drop_V", "drop_percent", "conductorTemperature_C"] as const) expect(r[k]).toBeCloseTo(f[k], 9);
      expect(r.pass).toBe(f.pass);
    });
  });

  it("writes a template that the importer reads (the table row needs a table)", () => {
    const t = templateCsv();
    expect(t.startsWith("\uFEFFtag,from,to,")).toBe(true);
    const r = run(t);
    expect(r.rowCount).toBe(2);
    expect(r.validCount).toBe(1);
    expect(r.errors[0]!.message).toMatch(/no ampacity table was chosen/);
  });
});

describe("results hash", () => {
  it("equals the SHA-256 of the canonical JSON of engine version, options and results", () => {
    const r = run(`${HEADER}\n${ROW}\n${ROW.replace("F-1", "F-2").replace(",80,", ",120,")}\n`);
    const options = { limitId: "iec-a-other", notices: r.notices, table: null };
    expect(scheduleResultsHash("1.0.0", options, r.results)).toBe(sha256Hex(canonicalJson({ engineVersion: "1.0.0", options, results: r.results })));
    expect(scheduleResultsHash("1.0.0", options, [])).toBe(sha256Hex(canonicalJson({ engineVersion: "1.0.0", options, results: [] })));
    expect(scheduleResultsHash("1.0.1", options, r.results)).not.toBe(scheduleResultsHash("1.0.0", options, r.results));
  });
});
