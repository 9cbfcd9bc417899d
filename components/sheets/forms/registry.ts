import type { KindModule } from "./types";

/**
 * Loads one kind's form module on demand, so the sheet page ships only the form, schema
 * and (for cheap kinds) the calculation of the sheet being edited.
 */
export const KIND_MODULES: Record<string, () => Promise<KindModule>> = {
  "busbar-rating": () => import("./busbar-rating").then((m) => m.busbarRating),
  "busbar-sizing": () => import("./busbar-sizing").then((m) => m.busbarSizing),
  "voltage-drop": () => import("./voltage-drop").then((m) => m.voltageDropKind),
  "fault-withstand": () => import("./fault-withstand").then((m) => m.faultWithstand),
  "enclosure-heat": () => import("./enclosure-heat").then((m) => m.enclosureHeat),
  "parallel-sharing": () => import("./parallel-sharing").then((m) => m.parallelSharingKind),
  "bus-network": () => import("./bus-network").then((m) => m.busNetworkKind),
};

export function hasSheetForm(kind: string): boolean {
  return Object.prototype.hasOwnProperty.call(KIND_MODULES, kind);
}
