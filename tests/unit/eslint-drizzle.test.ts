// Proves that lint refuses an update or delete without `.where(…)` in the shapes our
// code uses: `db()` (a call returning the Drizzle client) and `tx` (a transaction).
import { createRequire } from "node:module";
import path from "node:path";
import { ESLint, RuleTester, type Rule } from "eslint";
import tseslint from "typescript-eslint";
import { describe, expect, it } from "vitest";

const require = createRequire(import.meta.url);
const drizzle = require("eslint-plugin-drizzle") as { rules: Record<string, Rule.RuleModule> };

RuleTester.describe = describe;
RuleTester.it = it;
RuleTester.itOnly = it.only;

const options = [{ drizzleObjectName: ["db", "tx"] }];
const tester = new RuleTester({ languageOptions: { parser: tseslint.parser, ecmaVersion: 2022, sourceType: "module" } });

tester.run("enforce-delete-with-where on db() and tx", drizzle.rules["enforce-delete-with-where"]!, {
  valid: [
    { code: "await db().delete(users).where(eq(users.id, 1));", options },
    { code: "await tx.delete(invitations).where(eq(invitations.id, id));", options },
    // Not Drizzle: a Map's delete is untouched.
    { code: "const seen = new Map(); seen.delete(key);", options },
  ],
  invalid: [
    { code: "await db().delete(users);", options, errors: 1 },
    { code: "await tx.delete(users);", options, errors: 1 },
  ],
});

tester.run("enforce-update-with-where on db() and tx", drizzle.rules["enforce-update-with-where"]!, {
  valid: [
    { code: "await db().update(users).set({ name: 'x' }).where(eq(users.id, 1));", options },
    { code: "await tx.update(projects).set({ version: 2 }).where(and(eq(projects.id, id), eq(projects.version, 1)));", options },
    { code: "hash.update(buffer);", options },
  ],
  invalid: [
    { code: "await db().update(users).set({ name: 'x' });", options, errors: 1 },
    { code: "await tx.update(projects).set({ version: 2 });", options, errors: 1 },
  ],
});

describe("the repository's eslint.config.mjs", () => {
  it("reports both rules as errors in a query module", async () => {
    const eslint = new ESLint({ cwd: path.resolve(import.meta.dirname, "../..") });
    const code = [
      'import { db, type Tx } from "@/db/client";',
      'import { users } from "@/db/schema";',
      "export async function wipe(tx: Tx) {",
      "  await db().delete(users);",
      "  await tx.update(users).set({ name: 'x' });",
      "}",
      "",
    ].join("\n");
    const [result] = await eslint.lintText(code, { filePath: "db/queries/example.ts" });
    const ids = (result?.messages ?? []).filter((m) => m.severity === 2).map((m) => m.ruleId);
    expect(ids).toContain("drizzle/enforce-delete-with-where");
    expect(ids).toContain("drizzle/enforce-update-with-where");
  }, 60_000);
});
