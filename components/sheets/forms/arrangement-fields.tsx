"use client";

import { ChoiceField, NumField } from "./kit";
import { BARS_PER_PHASE_OPTIONS, ORIENTATION_OPTIONS, PHASE_OPTIONS } from "./options";

/** The bar arrangement fields at `prefix` ("arrangement" or "conductor.arrangement"). */
export function ArrangementFields({ prefix }: { prefix: string }) {
  return (
    <>
      <NumField path={`${prefix}.barWidth_m`} label="Bar width" hint="The larger dimension of one bar" />
      <NumField path={`${prefix}.barThickness_m`} label="Bar thickness" />
      <ChoiceField path={`${prefix}.barsPerPhase`} label="Bars per phase" options={BARS_PER_PHASE_OPTIONS} />
      <NumField path={`${prefix}.gap_m`} label="Gap between bars" hint="Clear gap within a phase; usually the bar thickness" />
      <ChoiceField path={`${prefix}.phases`} label="Phases" options={PHASE_OPTIONS} />
      <NumField path={`${prefix}.phaseSpacing_m`} label="Phase spacing" hint="Centre to centre of neighbouring phase packs" />
      <ChoiceField path={`${prefix}.orientation`} label="Orientation" options={ORIENTATION_OPTIONS} />
    </>
  );
}
