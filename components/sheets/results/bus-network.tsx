"use client";

import { useState } from "react";
import { NetworkDiagram } from "@/components/sheets/pictures/network-diagram";
import { NetworkPathVoltage } from "@/components/sheets/pictures/network-path";
import type { NetworkInput, NetworkResults } from "@/lib/engine/network";
import type { UnitSystem } from "@/lib/sheets/units";
import { DeadBranches, HottestSegments, NetworkKeyValues, SupplyTable } from "./bus-network-tables";

/** Bus network: key values, the diagram, the voltage along a path, hottest and dead branches. */
export function BusNetworkKeyResults({ results, inputs, unitSystem }: { results: NetworkResults; inputs: Record<string, unknown>; unitSystem: UnitSystem }) {
  const [selected, setSelected] = useState<string | undefined>(undefined);
  const input = inputs as unknown as NetworkInput;
  // The pictures need the input the result belongs to; a half-typed table can lag a result by one keystroke.
  const consistent = Array.isArray(input.segments) && input.segments.length === results.segments.length;
  return (
    <div className="space-y-4">
      <NetworkKeyValues results={results} unitSystem={unitSystem} />
      <SupplyTable results={results} unitSystem={unitSystem} />
      {consistent ? (
        <>
          <NetworkDiagram input={input} results={results} unitSystem={unitSystem} selectedSegmentId={selected} onSelectSegment={setSelected} />
          <NetworkPathVoltage input={input} results={results} unitSystem={unitSystem} />
        </>
      ) : null}
      <HottestSegments results={results} unitSystem={unitSystem} selected={selected} onSelect={setSelected} />
      <DeadBranches results={results} />
    </div>
  );
}

