import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { closeDb } from "@/db/client";
import { GET as listKinds } from "@/app/api/v1/calc/route";
import { GET as getKind, POST as runKind } from "@/app/api/v1/calc/[kind]/route";
import { CALC_EXAMPLES } from "@/app/api/v1/calc/examples";
import { MAX_CALC_BODY_BYTES } from "@/app/api/v1/calc/body";
import { listTokens, revokeToken } from "@/lib/auth/tokens";
import { CALC_KIND_NAMES, CALC_KINDS, ENGINE_VERSION, runCalc } from "@/lib/engine";
import { clearSizingCache } from "@/lib/engine/busbar-sizing";
import { actorOf, call, tokenFor } from "../support/api";
import { makeOrg, makeUser, type TestUser } from "../support/db";

// The stateless calculation endpoint, called as Next calls it, authenticated with real
// API tokens (hashed in the test database, resolved by the token module).

let engineer: TestUser;
let engineerToken: string;
let viewerToken: string;

const post = (kind: string, body: unknown, token = engineerToken) => call(runKind, { token, body, params: { kind }, path: `/api/v1/calc/${kind}` });

beforeAll(async () => {
  const org = await makeOrg("Calc Bench Panels");
  engineer = await makeUser(org.id, "engineer");
  engineerToken = await tokenFor(engineer);
  viewerToken = await tokenFor(await makeUser(org.id, "viewer"));
});

afterAll(async () => {
  await closeDb();
});

describe("GET /api/v1/calc", () => {
  it("lists every engine kind with its title and address", async () => {
    const r = await call(listKinds, { token: viewerToken, path: "/api/v1/calc" });
    expect(r.status).toBe(200);
    expect(r.json.engineVersion).toBe(ENGINE_VERSION);
    expect(r.json.kinds.map((k: { kind: string }) => k.kind)).toEqual(CALC_KIND_NAMES);
    for (const k of r.json.kinds) {
      expect(k.title).toBe(CALC_KINDS[k.kind as keyof typeof CALC_KINDS].title);
      expect(k.href).toBe(`/api/v1/calc/${k.kind}`);
    }
  });

  it("GET /api/v1/calc/{kind} gives the JSON Schema of the kind's input", async () => {
    const r = await call(getKind, { token: viewerToken, params: { kind: "voltage-drop" } });
    expect(r.status).toBe(200);
    expect(r.json.inputSchema.type).toBe("object");
    expect(r.json.inputSchema.required).toEqual(expect.arrayContaining(["system", "nominalVoltage_V", "length_m", "area_m2"]));
    expect((await call(getKind, { token: viewerToken, params: { kind: "flux-capacitor" } })).status).toBe(404);
  });

  it("refuses a request without valid credentials (401)", async () => {
    const r = await call(listKinds, { token: "ohm_" + "x".repeat(43) });
    expect(r.status).toBe(401);
    expect(r.json.error.code).toBe("unauthenticated");
    expect((await call(listKinds, { token: "not-a-token" })).status).toBe(401);
  });
});

describe("POST /api/v1/calc/{kind}", () => {
  for (const kind of CALC_KIND_NAMES) {
    it(`${kind}: a valid input gives 200 and the engine's CalcResult, unchanged`, async () => {
      // Busbar sizing reports how many filament solves its cache spared: start both runs cold.
      clearSizingCache();
      const r = await post(kind, CALC_EXAMPLES[kind]);
      expect(r.status, JSON.stringify(r.json).slice(0, 400)).toBe(200);
      expect(r.json).toMatchObject({ kind, engineVersion: ENGINE_VERSION });
      for (const key of ["formulas", "warnings", "checks"]) expect(Array.isArray(r.json[key])).toBe(true);
      expect(typeof r.json.results).toBe("object");
      expect(typeof r.json.intermediates).toBe("object");
      clearSizingCache();
      const direct = runCalc(kind, CALC_EXAMPLES[kind]);
      if (!direct.ok) throw new Error(`example of ${kind} is invalid: ${JSON.stringify(direct.fields)}`);
      expect(r.json).toEqual(JSON.parse(JSON.stringify(direct.result)));
    });
  }

  it("any member may calculate: a viewer's token gets 200", async () => {
    const r = await post("enclosure-heat", CALC_EXAMPLES["enclosure-heat"], viewerToken);
    expect(r.status).toBe(200);
    expect(r.json.kind).toBe("enclosure-heat");
  });

  it("numbers may arrive as numeric strings (form values)", async () => {
    const r = await post("voltage-drop", { ...CALC_EXAMPLES["voltage-drop"], length_m: "180", current_A: " 80 " });
    expect(r.status).toBe(200);
    expect(r.json).toEqual((await post("voltage-drop", CALC_EXAMPLES["voltage-drop"])).json);
  });

  it("bad input is a 400 whose fields name each field and the allowed range", async () => {
    const r = await post("voltage-drop", { ...CALC_EXAMPLES["voltage-drop"], length_m: -5, powerFactor: "lots", system: "ac-9ph" });
    expect(r.status).toBe(400);
    expect(r.json.error.code).toBe("validation");
    expect(r.json.error.fields.length_m).toMatch(/Route length must be from 0 to 100000 m/);
    expect(r.json.error.fields.powerFactor).toMatch(/Power factor must be a number from 0 to 1/);
    expect(r.json.error.fields.system).toMatch(/Supply system must be one of: /);
  });

  it("nested fields are named by their path", async () => {
    const input = structuredClone(CALC_EXAMPLES["enclosure-heat"]) as { losses: { loss_W: unknown }[] };
    input.losses[1]!.loss_W = "2e9";
    const r = await post("enclosure-heat", input);
    expect(r.status).toBe(400);
    expect(Object.keys(r.json.error.fields)).toEqual(["losses.1.loss_W"]);
    expect(r.json.error.fields["losses.1.loss_W"]).toMatch(/Power loss must be from 0 to 1000000 W/);
  });

  it("a missing required field says it is required", async () => {
    const { area_m2: _drop, ...rest } = CALC_EXAMPLES["cable-ampacity"];
    const r = await post("cable-ampacity", rest);
    expect(r.status).toBe(400);
    expect(r.json.error.fields.area_m2).toMatch(/Conductor cross-section is required/);
  });

  it("a body that is not JSON, or not an object, is a 400", async () => {
    const notJson = await post("resistance", "{ length_m: 3");
    expect(notJson.status).toBe(400);
    expect(notJson.json.error.fields._).toMatch(/must be JSON/);
    const array = await post("resistance", [1, 2, 3]);
    expect(array.status).toBe(400);
    expect(Object.keys(array.json.error.fields).length).toBeGreaterThan(0);
  });

  it("a body over the size limit is a 400 before parsing", async () => {
    const big = JSON.stringify({ ...CALC_EXAMPLES["voltage-drop"], padding: "x".repeat(MAX_CALC_BODY_BYTES) });
    const r = await post("voltage-drop", big);
    expect(r.status).toBe(400);
    expect(r.json.error.fields._).toMatch(/at most 1024 KB/);
  });

  it("an unknown kind is a 404 listing the known kinds", async () => {
    const r = await post("flux-capacitor", CALC_EXAMPLES["voltage-drop"]);
    expect(r.status).toBe(404);
    expect(r.json.error.code).toBe("not_found");
    expect(r.json.error.message).toContain("voltage-drop");
    expect((await post("__proto__", {})).status).toBe(404);
    expect((await post("constructor", {})).status).toBe(404);
  });

  it("a revoked token is refused with 401", async () => {
    const token = await tokenFor(engineer, "short-lived");
    expect((await post("cable-ampacity", CALC_EXAMPLES["cable-ampacity"], token)).status).toBe(200);
    const row = (await listTokens(actorOf(engineer))).find((t) => t.name === "short-lived");
    await revokeToken(actorOf(engineer), row!.id);
    const r = await post("cable-ampacity", CALC_EXAMPLES["cable-ampacity"], token);
    expect(r.status).toBe(401);
    expect(r.json.error.message).toMatch(/revoked/);
  });
});
