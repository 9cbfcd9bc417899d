import { readFileSync } from "node:fs";
import path from "node:path";
import { describe, expect, it } from "vitest";
import { solveNetwork, type NetworkInput } from "@/lib/engine/network";
import { runCalc } from "@/lib/engine";
import { defaultInputs, networkNodes, sheetKind, type ProjectBasis } from "@/lib/sheets/kinds";
import { MAX_NETWORK_FILE_BYTES, parseNetworkFile, problemText, type NetworkImport } from "@/lib/sheets/network-import";
import { toEngineInputs, toFormValues } from "@/lib/sheets/units";

const FIXTURE = readFileSync(path.join(__dirname, "..", "engine", "fixtures", "bus-network.json"), "utf8");

/** The fixture network (tests/engine/fixtures/bus-network.json) written in the CSV format. */
const CSV = [
  "record,id,material,area_mm2,temperature_C,reactance_mohm_per_m,ampacity_A,from,to,conductor,length_m,node,current_A,pf,voltage_V,name,value",
  "setting,,,,,,,,,,,,,,,mode,ac",
  "setting,,,,,,,,,,,,,,,frequency_Hz,50",
  "setting,,,,,,,,,,,,,,,ambient_C,35",
  "setting,,,,,,,,,,,,,,,dropLimit_pct,1",
  "conductor,main,cu-etp,1000,70,0.15,1600,,,,,,,,,,",
  "conductor,tap,cu-annealed,35,70,0.08,158,,,,,,,,,,",
  "segment,bus-1,,,,,,incomer,B1,main,0.6,,,,,,",
  "segment,bus-2,,,,,,B1,B2,main,0.6,,,,,,",
  "segment,bus-3,,,,,,B2,B3,main,0.6,,,,,,",
  "segment,feeder-1,,,,,,B1,M1,tap,12,,,,,,",
  "segment,feeder-2,,,,,,B2,M2,tap,18,,,,,,",
  "segment,feeder-3,,,,,,B3,M3,tap,25,,,,,,",
  "supply,,,,,,,,,,,incomer,,,230,,",
  "load,,,,,,,,,,,M1,60,0.85,,,",
  "load,,,,,,,,,,,M2,90,0.85,,,",
  "load,,,,,,,,,,,M3,45,0.9,,,",
].join("\n");

function ok(r: NetworkImport) {
  if (!r.ok) throw new Error(`expected a network, got: ${r.problems.map(problemText).join("; ")}`);
  return r;
}
function problems(r: NetworkImport) {
  if (r.ok) throw new Error("expected problems, got a network");
  return r.problems;
}

describe("network import: CSV", () => {
  it("reads the fixture network and solves it to the same currents as the JSON fixture", () => {
    const r = ok(parseNetworkFile("panel.csv", CSV));
    expect(r.format).toBe("csv");
    expect(r.counts).toEqual({ nodes: 7, segments: 6, loads: 3, supplies: 1, conductors: 2 });
    const fromCsv = solveNetwork(r.network);
    const fromJson = solveNetwork(JSON.parse(FIXTURE) as NetworkInput);
    // mm² and mΩ/m are scaled to SI to 9 significant figures: the currents agree closely
    fromJson.results.segments.forEach((s, i) => expect(fromCsv.results.segments[i]!.current_A).toBeCloseTo(s.current_A, 6));
    expect(r.network.conductors[0]).toMatchObject({ id: "main", area_m2: 1e-3, reactance_ohm_per_m: 1.5e-4, ampacity_A: 1600 });
  });

  it("skips empty lines, ignores a byte-order mark and header case, and keeps file row numbers", () => {
    const lines = CSV.split("\n");
    const withGaps = ["\uFEFF" + lines[0]!.toUpperCase(), "", ...lines.slice(1, 8), "   ", "", ...lines.slice(8)].join("\r\n");
    ok(parseNetworkFile("panel.csv", new TextEncoder().encode(withGaps)));
    // a bad length on the first segment row, reported at its row in the file (blank lines counted)
    const bad = withGaps.replace("segment,bus-1,,,,,,incomer,B1,main,0.6", "segment,bus-1,,,,,,incomer,B1,main,-2");
    const rowOfBus1 = bad.split("\r\n").findIndex((l) => l.startsWith("segment,bus-1")) + 1;
    const p = problems(parseNetworkFile("panel.csv", bad));
    expect(p).toEqual([{ row: rowOfBus1, column: "length_m", message: "length must be from 0.0001 to 10000 m" }]);
    expect(problemText(p[0]!)).toBe(`Row ${rowOfBus1}, column length_m: length must be from 0.0001 to 10000 m`);
  });

  it("names the row and column of each problem, with ranges in the file's units", () => {
    const lines = CSV.split("\n");
    const rowOf = (prefix: string) => lines.findIndex((l) => l.startsWith(prefix)) + 1;
    const bad = CSV.replace("conductor,tap,cu-annealed,35,", "conductor,tap,cu-annealed,abc,").replace("load,,,,,,,,,,,M3,45,0.9", "load,,,,,,,,,,,M3,45,1.4");
    expect(problems(parseNetworkFile("panel.csv", bad))).toEqual([
      { row: rowOf("conductor,tap"), column: "area_mm2", message: "cross-section must be a number from 0.01 to 100000 mm²" },
      { row: rowOf("load,,,,,,,,,,,M3"), column: "pf", message: "power factor must be from 0 to 1" },
    ]);
    // references between records are checked once every value reads
    const refs = CSV.replace("segment,feeder-2,,,,,,B2,M2,tap,18", "segment,feeder-2,,,,,,B2,M2,nope,18").replace("load,,,,,,,,,,,M3,45,0.9", "load,,,,,,,,,,,M9,45,0.9");
    expect(problems(parseNetworkFile("panel.csv", refs))).toEqual([
      { row: rowOf("segment,feeder-2"), column: "conductor", message: 'conductor "nope" is not in the conductor list' },
      { row: rowOf("load,,,,,,,,,,,M3"), column: "node", message: 'load node "M9" is not in the node list' },
    ]);
  });

  it("refuses unknown record types, unknown columns and a missing record column in plain words", () => {
    expect(problems(parseNetworkFile("x.csv", CSV.replace("load,,,,,,,,,,,M1", "lode,,,,,,,,,,,M1")))).toEqual([
      { row: CSV.split("\n").findIndex((l) => l.startsWith("load,,,,,,,,,,,M1")) + 1, column: "record", message: 'unknown record type "lode"; use one of: setting, conductor, segment, load, supply' },
    ]);
    expect(problems(parseNetworkFile("x.csv", "kind,id\nsegment,a\n"))[0]!.message).toMatch(/needs a "record" column/);
    expect(problems(parseNetworkFile("x.csv", CSV.replace("pf,voltage_V", "powerfactor,voltage_V")))[0]).toMatchObject({ row: 1, column: "powerfactor" });
    expect(problems(parseNetworkFile("x.csv", CSV.replace("mode,ac", "mood,ac")))[0]).toMatchObject({ row: 2, column: "name" });
  });

  it("takes settings the file leaves out from the sheet, and says when there is no supply", () => {
    const noSettings = CSV.split("\n").filter((l) => !l.startsWith("setting")).join("\n");
    const r = ok(parseNetworkFile("x.csv", noSettings, { mode: "dc", ambient_C: 40 }));
    expect(r.network).toMatchObject({ mode: "dc", ambient_C: 40 });
    const noSupply = CSV.split("\n").filter((l) => !l.startsWith("supply")).join("\n");
    expect(problems(parseNetworkFile("x.csv", noSupply))[0]!.message).toMatch(/no supply row/);
  });

  it("refuses an empty file, a file with only blank lines and a file that is not UTF-8", () => {
    expect(problems(parseNetworkFile("x.csv", ""))[0]!.message).toBe("The file is empty.");
    expect(problems(parseNetworkFile("x.csv", "\n\n  \n"))[0]!.message).toBe("The file has no rows.");
    expect(problems(parseNetworkFile("x.csv", new Uint8Array([0x72, 0xff, 0xfe, 0x0a])))[0]!.message).toMatch(/not UTF-8/);
  });
});

describe("network import: JSON", () => {
  it("reads the engine's input shape", () => {
    const r = ok(parseNetworkFile("net.json", FIXTURE));
    expect(r.format).toBe("json");
    expect(r.counts.segments).toBe(6);
  });

  it("derives the node list when the file leaves it out", () => {
    const { nodes: _n, ...rest } = JSON.parse(FIXTURE) as NetworkInput;
    const r = ok(parseNetworkFile("net.json", JSON.stringify(rest)));
    expect(r.network.nodes.map((n) => n.id).sort()).toEqual(["B1", "B2", "B3", "M1", "M2", "M3", "incomer"]);
  });

  it("names the record and field of each problem", () => {
    const net = JSON.parse(FIXTURE) as { segments: { length_m: unknown }[] };
    net.segments[2]!.length_m = "far";
    const p = problems(parseNetworkFile("net.json", JSON.stringify(net)));
    expect(p).toEqual([{ column: "segments[3].length_m", message: 'Segment 3 "bus-3": length must be a number from 0.0001 to 10000 m' }]);
    expect(problems(parseNetworkFile("net.json", "{ not json"))[0]!.message).toMatch(/not valid JSON/);
    expect(problems(parseNetworkFile("net.json", "[1,2]"))[0]!.message).toMatch(/one object/);
  });
});

describe("network import: size limit", () => {
  it("refuses a file over 30 MB, naming its size and the limit", () => {
    const big = new Uint8Array(MAX_NETWORK_FILE_BYTES + 1);
    const p = problems(parseNetworkFile("huge.csv", big));
    expect(p[0]!.message).toBe("The file is 30.0 MB; network files can be at most 30 MB. Split the network or remove unused records.");
    // exactly at the limit it is read (and then judged on its content)
    const atLimit = new Uint8Array(MAX_NETWORK_FILE_BYTES).fill(0x20);
    expect(problems(parseNetworkFile("blank.csv", atLimit))[0]!.message).toBe("The file has no rows.");
  });
});

describe("bus network sheet: starting network and form values", () => {
  const IEC: ProjectBasis = { unitSystem: "metric", systemVoltage: 400, systemType: "3ph-4w", frequency: 50, designAmbientC: 35, altitudeM: 0, standardFamily: "iec" };
  const NA: ProjectBasis = { unitSystem: "imperial", systemVoltage: 480, systemType: "3ph-3w", frequency: 60, designAmbientC: 40, altitudeM: 0, standardFamily: "north-american" };

  it("starts from a small panel of the project's system, with its spare way carrying no current", () => {
    const inputs = defaultInputs("bus-network", IEC);
    expect(inputs).toMatchObject({ mode: "ac", frequency_Hz: 50, ambient_C: 35, supplies: [{ node: "INC", voltage_V: 230.94 }] });
    const out = runCalc("bus-network", inputs);
    if (!out.ok) throw new Error(JSON.stringify(out.fields));
    const r = out.result.results as { segments: { id: string; current_A: number }[] };
    expect(r.segments.find((x) => x.id === "TO-4")!.current_A).toBe(0);
    expect(defaultInputs("bus-network", { ...IEC, systemType: "dc", frequency: 0, systemVoltage: 110 })).toMatchObject({ mode: "dc", supplies: [{ voltage_V: 110 }] });
  });

  it("round-trips through the form in both unit systems; node names stay text; the node list follows the segments", () => {
    for (const basis of [IEC, NA]) {
      const stored = defaultInputs("bus-network", basis);
      const form = toFormValues("bus-network", stored, basis.unitSystem);
      const complete = sheetKind("bus-network")!.complete!;
      const back = complete(toEngineInputs("bus-network", form, basis.unitSystem));
      expect(back).toEqual(stored);
    }
    const form = toFormValues("bus-network", defaultInputs("bus-network", IEC), "metric") as { segments: Record<string, unknown>[]; conductors: Record<string, unknown>[] };
    expect(form.conductors[0]).toMatchObject({ area_m2: "1000", reactance_ohm_per_m: "0.15" });
    form.segments[0] = { ...form.segments[0], to: "1" };
    const si = sheetKind("bus-network")!.complete!(toEngineInputs("bus-network", form, "metric"));
    expect((si.segments as { to: unknown }[])[0]!.to).toBe("1");
    expect(networkNodes(si).map((n) => n.id)).toContain("1");
    // a load on a name no segment uses is not made a node: the engine names the mistake
    const typo = { ...si, loads: [{ node: "M9", current_A: 10, pf: 1 }] };
    const out = runCalc("bus-network", sheetKind("bus-network")!.complete!(typo));
    expect(out.ok ? null : out.fields["loads.0.node"]).toBe('load node "M9" is not in the node list');
  });
});
