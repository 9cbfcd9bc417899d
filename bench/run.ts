// `npm run bench`: prints the engine and application figures side by side.
// Benchmarks print measurements; they are not timed tests and never fail a build.
import os from "node:os";

const parts = process.argv.slice(2).filter((a) => a !== "--");
const all = ["voltage-drop", "busbar", "resistance", "network", "network-server", "api", "first-load", "live-calc", "pdf", "schedule"];
const chosen = parts.length ? parts : all;

console.log(`Ohmstead bench — ${new Date().toISOString()} — node ${process.version}, ${os.cpus().length} cores (${os.cpus()[0]?.model ?? "?"}), ${(os.totalmem() / 2 ** 30).toFixed(1)} GiB`);
for (const name of chosen) {
  console.log(`\n=== ${name} ===`);
  const mod = (await import(`./${name}.ts`)) as { run: () => Promise<void> };
  await mod.run();
}
