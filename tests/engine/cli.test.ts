import { describe, expect, it } from "vitest";
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { ENGINE_VERSION, runCalc } from "../../lib/engine";

/**
 * The engine's command line (scripts/calc.ts) end to end: a file, stdin, and invalid
 * input. Three child processes only (each starts tsx, about a second).
 */

const ROOT = path.resolve(__dirname, "../..");
const FIXTURE = path.join("tests", "engine", "fixtures", "voltage-drop.json");
const SPAWN_TIMEOUT = 60_000;

function calc(args: string[], input?: string) {
  const r = spawnSync("npx", ["tsx", "scripts/calc.ts", ...args], { cwd: ROOT, encoding: "utf8", input, timeout: SPAWN_TIMEOUT, env: { ...process.env, NODE_NO_WARNINGS: "1" } });
  if (r.error) throw r.error;
  return r;
}

describe("calc CLI", () => {
  it(
    "a valid input file: exit 0 and the result JSON on stdout",
    () => {
      const r = calc(["voltage-drop", FIXTURE]);
      expect(r.status).toBe(0);
      const out = JSON.parse(r.stdout) as { kind: string; engineVersion: string; results: Record<string, unknown>; formulas: unknown[] };
      expect(out.engineVersion).toBe(ENGINE_VERSION);
      expect(Object.keys(out.results).length).toBeGreaterThan(0);
      expect(out.formulas.length).toBeGreaterThan(0);
    },
    SPAWN_TIMEOUT + 5_000,
  );

  it(
    "JSON on stdin: the same result as runCalc in this process",
    () => {
      const text = readFileSync(path.join(ROOT, "tests", "engine", "fixtures", "bus-network.json"), "utf8");
      const r = calc(["bus-network"], text);
      expect(r.status).toBe(0);
      const direct = runCalc("bus-network", JSON.parse(text));
      if (!direct.ok) throw new Error(JSON.stringify(direct.fields));
      expect(JSON.parse(r.stdout)).toEqual(JSON.parse(JSON.stringify(direct.result)));
    },
    SPAWN_TIMEOUT + 5_000,
  );

  it(
    "invalid input: exit 2 and the field messages on stderr, nothing on stdout",
    () => {
      const dir = mkdtempSync(path.join(os.tmpdir(), "ohmstead-calc-"));
      try {
        const file = path.join(dir, "bad.json");
        const bad = { ...(JSON.parse(readFileSync(path.join(ROOT, FIXTURE), "utf8")) as object), current_A: "abc", length_m: -1 };
        writeFileSync(file, JSON.stringify(bad));
        const r = calc(["voltage-drop", file]);
        expect(r.status).toBe(2);
        expect(r.stdout).toBe("");
        expect(r.stderr).toContain('invalid input for "voltage-drop"');
        expect(r.stderr).toMatch(/^\s+current_A: Load current must be a number/m);
        expect(r.stderr).toMatch(/^\s+length_m: Route length must be from 0/m);
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    },
    SPAWN_TIMEOUT + 5_000,
  );
});
