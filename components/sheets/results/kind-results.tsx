"use client";

import type { BusbarRatingResults } from "@/lib/engine/busbar-thermal";
import type { BusbarSizingResults, SizingCandidate } from "@/lib/engine/busbar-sizing";
import type { CalcResult } from "@/lib/engine/core/result";
import type { EnclosureHeatResults } from "@/lib/engine/enclosure-heat";
import type { FilamentDensity } from "@/lib/engine/filament";
import type { NetworkResults } from "@/lib/engine/network";
import type { ParallelSharingResults } from "@/lib/engine/parallel";
import type { FaultWithstandResults } from "@/lib/engine/short-circuit";
import type { VoltageDropResults } from "@/lib/engine/voltage-drop";
import type { UnitSystem } from "@/lib/sheets/units";
import dynamic from "next/dynamic";

// One chunk per kind: a sheet's page loads only its own kind's results and pictures.
const loading = () => <p className="py-6 text-sm text-fen-600">Drawing the results…</p>;
const BusbarRatingKeyResults = dynamic(() => import("./busbar-rating").then((m) => m.BusbarRatingKeyResults), { loading });
const BusbarSizingKeyResults = dynamic(() => import("./busbar-sizing").then((m) => m.BusbarSizingKeyResults), { loading });
const BusNetworkKeyResults = dynamic(() => import("./bus-network").then((m) => m.BusNetworkKeyResults), { loading });
const EnclosureHeatKeyResults = dynamic(() => import("./enclosure-heat").then((m) => m.EnclosureHeatKeyResults), { loading });
const FaultWithstandKeyResults = dynamic(() => import("./fault-withstand").then((m) => m.FaultWithstandKeyResults), { loading });
const ParallelSharingKeyResults = dynamic(() => import("./parallel-sharing").then((m) => m.ParallelSharingKeyResults), { loading });
const VoltageDropKeyResults = dynamic(() => import("./voltage-drop").then((m) => m.VoltageDropKeyResults), { loading });

/** The key results (and pictures) of a result, by its kind. */
export function KindResults({
  result,
  inputs,
  unitSystem,
  density,
  onPick,
}: {
  result: CalcResult<unknown>;
  inputs: Record<string, unknown>;
  unitSystem: UnitSystem;
  density?: readonly FilamentDensity[];
  onPick?: (c: SizingCandidate) => void;
}) {
  switch (result.kind) {
    case "busbar-rating":
      return <BusbarRatingKeyResults results={result.results as BusbarRatingResults} inputs={inputs} unitSystem={unitSystem} density={density} />;
    case "busbar-sizing":
      return <BusbarSizingKeyResults results={result.results as BusbarSizingResults} unitSystem={unitSystem} onPick={onPick} />;
    case "voltage-drop":
      return <VoltageDropKeyResults results={result.results as VoltageDropResults} inputs={inputs} unitSystem={unitSystem} />;
    case "fault-withstand":
      return <FaultWithstandKeyResults results={result.results as FaultWithstandResults} unitSystem={unitSystem} />;
    case "enclosure-heat":
      return <EnclosureHeatKeyResults results={result.results as EnclosureHeatResults} unitSystem={unitSystem} />;
    case "parallel-sharing":
      return <ParallelSharingKeyResults results={result.results as ParallelSharingResults} inputs={inputs} unitSystem={unitSystem} />;
    case "bus-network":
      return <BusNetworkKeyResults results={result.results as NetworkResults} inputs={inputs} unitSystem={unitSystem} />;
    default:
      return null;
  }
}
