/**
 * The shapes of a cable schedule as it is read, computed, stored and shown. Plain data,
 * SI units (m, m², A, V, °C), shared by the server and the page's client table.
 */
import type { SupplySystem, VoltageDropLimitId } from "@/lib/engine/voltage-drop";

/** Upload limits, named in the messages that refuse a file. */
export const MAX_FILE_BYTES = 10 * 1024 * 1024;
export const MAX_FILE_LABEL = "10 MB";
export const MAX_ROWS = 20_000;

export const METALS = ["copper", "aluminium"] as const;
export type ScheduleMetal = (typeof METALS)[number];

/** One data row of the file after validation, in SI. */
export interface ScheduleRowInput {
  /** Row number as a spreadsheet shows it (the header is row 1). */
  row: number;
  tag: string;
  from: string;
  to: string;
  material: ScheduleMetal;
  insulation: string;
  /** As written in the file (e.g. "4/0", "95"), and how it reads. */
  sizeText: string;
  sizeLabel: string;
  /** Which standard series the size was written in (for the suggested size). */
  sizeSeries: "iec-60228" | "awg-kcmil";
  size_m2: number;
  parallel: number;
  length_m: number;
  current_A: number;
  powerFactor: number | null;
  system: SupplySystem;
  voltage_V: number;
  installation: string;
  /** Ampacity of one conductor as given in the file, A. */
  ampacityGiven_A: number | null;
  /** Ambient from the file, or null when the project's design ambient applies. */
  ambient_C: number | null;
  grouping: number | null;
  maxTemperature_C: number | null;
}

export interface ScheduleError {
  /** Row number (header = 1), or 0 for the file as a whole. */
  row: number;
  /** The column's header as written, or "" when the message is about the row or the file. */
  column: string;
  message: string;
}

export interface ScheduleOptions {
  limitId: VoltageDropLimitId;
  /** Organisation or project override of the limit, percent. */
  limitPercent?: number;
  /** Ambient for rows that leave it empty (the project's design ambient), °C. */
  defaultAmbient_C: number;
  /** Frequency of AC rows, Hz. */
  frequency_Hz: number;
}

/** The organisation ampacity table used, as the schedule names it. */
export interface ScheduleTableRef {
  id: number;
  name: string;
  version: number;
  source: string;
}

export type AmpacitySource = "given" | "table";

/** One computed row, as stored (SI) and shown. */
export interface ScheduleRowResult {
  row: number;
  tag: string;
  from: string;
  to: string;
  material: ScheduleMetal;
  insulation: string;
  sizeText: string;
  sizeLabel: string;
  size_m2: number;
  parallel: number;
  length_m: number;
  current_A: number;
  powerFactor: number | null;
  system: SupplySystem;
  voltage_V: number;
  installation: string;
  ambient_C: number;
  ambientFromProject: boolean;
  ampacityGiven_A: number | null;
  grouping: number | null;
  ampacitySource: AmpacitySource;
  /** Tabulated value of one conductor and the factors applied (table rows only). */
  tabulated_A: number | null;
  ambientFactor: number | null;
  groupingFactor: number | null;
  /** Ampacity of the circuit: one conductor's × the number in parallel, A. */
  ampacity_A: number;
  /** Load current ÷ circuit ampacity. */
  utilisation: number;
  thetaMax_C: number;
  conductorTemperature_C: number;
  drop_V: number;
  drop_percent: number;
  limit_percent: number;
  /** Smallest standard size (same number in parallel) meeting the drop limit, or null when none does. */
  minimumSize: string | null;
  pass: boolean;
  /** Why the row fails, in plain words (empty when it passes). */
  reasons: string[];
  warnings: string[];
}

export interface ScheduleComputation {
  /** Data rows in the file (empty lines not counted). */
  rowCount: number;
  validCount: number;
  failCount: number;
  results: ScheduleRowResult[];
  errors: ScheduleError[];
  /** What was assumed about the file (separator, decimal comma, ignored columns). */
  notices: string[];
}
