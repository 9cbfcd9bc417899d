// Command line for the calculation engine.
//   npm run calc -- <kind> <input.json>      (or JSON on stdin:  npm run calc -- <kind> < input.json)
//   npm run calc -- --list                   lists the kinds
// Prints the result JSON. Invalid input exits with code 2 and the field messages.
import { readFileSync } from "node:fs";
import { CALC_KINDS, runCalc } from "../lib/engine";

const args = process.argv.slice(2).filter((a) => a !== "--");
if (args.length === 0 || args[0] === "--help" || args[0] === "--list") {
  console.log("usage: npm run calc -- <kind> [input.json]   (JSON on stdin when no file)\nkinds:");
  for (const k of Object.values(CALC_KINDS)) console.log(`  ${k.kind.padEnd(18)} ${k.title}`);
  process.exit(args.length === 0 ? 2 : 0);
}
const [kind, file] = args as [string, string | undefined];

let text: string;
try {
  text = file ? readFileSync(file, "utf8") : readFileSync(0, "utf8");
} catch (err) {
  console.error(`calc: cannot read ${file ?? "stdin"}: ${(err as Error).message}`);
  process.exit(2);
}
let raw: unknown;
try {
  raw = JSON.parse(text);
} catch (err) {
  console.error(`calc: input is not valid JSON: ${(err as Error).message}`);
  process.exit(2);
}
const out = runCalc(kind, raw);
if (!out.ok) {
  console.error(`calc: invalid input for "${kind}":`);
  for (const [field, message] of Object.entries(out.fields)) console.error(`  ${field}: ${message}`);
  process.exit(2);
}
console.log(JSON.stringify(out.result, null, 2));
