/**
 * Voltage-drop evaluations per second: the engine's allocation-free kernels against a bare
 * arithmetic loop doing the same formula, and the full zod-validated calculation.
 */
import { voltageDrop, voltageDropApprox, voltageDropExact } from "../lib/engine/voltage-drop";

function rate(label: string, n: number, body: (n: number) => number): void {
  body(Math.min(n, 10_000)); // warm-up
  const t0 = performance.now();
  const sink = body(n);
  const s = (performance.now() - t0) / 1000;
  console.log(`${label.padEnd(44)} ${(n / s).toExponential(3)} /s  (checksum ${sink.toPrecision(6)})`);
}

export async function run(): Promise<void> {
  const N = 5_000_000;
  console.log("voltage drop — evaluations per second (goal ≥ 1e6 /s for the kernels)");
  rate("bare loop, approximate formula", N, (n) => {
    let acc = 0;
    for (let i = 0; i < n; i++) {
      const L = 10 + (i % 500);
      acc += 1 * (0.7e-3 * 0.85 + 0.08e-3 * 0.5268) * L * 100;
    }
    return acc;
  });
  rate("engine voltageDropApprox", N, (n) => {
    let acc = 0;
    for (let i = 0; i < n; i++) acc += voltageDropApprox(1, 0.7e-3, 0.08e-3, 10 + (i % 500), 100, 0.85, 0.5268);
    return acc;
  });
  rate("bare loop, exact phasor (sending end given)", N, (n) => {
    let acc = 0;
    for (let i = 0; i < n; i++) {
      const k = (10 + (i % 500)) * 100;
      const a = k * (0.7e-3 * 0.85 + 0.08e-3 * 0.5268);
      const c = k * (0.08e-3 * 0.85 - 0.7e-3 * 0.5268);
      acc += 230.94 - (Math.sqrt(230.94 * 230.94 - c * c) - a);
    }
    return acc;
  });
  rate("engine voltageDropExact", N, (n) => {
    let acc = 0;
    for (let i = 0; i < n; i++) acc += voltageDropExact(1, 0.7e-3, 0.08e-3, 10 + (i % 500), 100, 0.85, 0.5268, 230.94, true);
    return acc;
  });
  rate("full calculation voltageDrop() (zod, result)", 2_000, (n) => {
    let acc = 0;
    for (let i = 0; i < n; i++)
      acc += voltageDrop({ system: "ac-3ph-4w", nominalVoltage_V: 400, current_A: 100, powerFactor: 0.85, length_m: 10 + (i % 500), area_m2: 50e-6 }).results.drop_percent;
    return acc;
  });
}
