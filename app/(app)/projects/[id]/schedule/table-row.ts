import type { ScheduleRowResult } from "@/lib/schedules/types";

/** What the results table needs of a computed row (the stored row has more). */
export interface ScheduleTableRow {
  row: number;
  tag: string;
  from: string;
  to: string;
  size: string;
  size_m2: number;
  material: string;
  insulation: string;
  parallel: number;
  length_m: number;
  current_A: number;
  ampacity_A: number;
  ampacitySource: "given" | "table";
  installation: string;
  utilisation: number;
  theta_C: number;
  thetaMax_C: number;
  drop_V: number;
  drop_percent: number;
  limit_percent: number;
  pass: boolean;
  reasons: string[];
  warnings: string[];
  minimumSize: string | null;
}

export function toTableRow(r: ScheduleRowResult): ScheduleTableRow {
  return {
    row: r.row,
    tag: r.tag,
    from: r.from,
    to: r.to,
    size: r.sizeLabel,
    size_m2: r.size_m2,
    material: r.material,
    insulation: r.insulation,
    parallel: r.parallel,
    length_m: r.length_m,
    current_A: r.current_A,
    ampacity_A: r.ampacity_A,
    ampacitySource: r.ampacitySource,
    installation: r.installation,
    utilisation: r.utilisation,
    theta_C: r.conductorTemperature_C,
    thetaMax_C: r.thetaMax_C,
    drop_V: r.drop_V,
    drop_percent: r.drop_percent,
    limit_percent: r.limit_percent,
    pass: r.pass,
    reasons: r.reasons,
    warnings: r.warnings,
    minimumSize: r.minimumSize,
  };
}
