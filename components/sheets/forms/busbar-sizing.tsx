"use client";

import { useFormContext } from "react-hook-form";
import { busbarSizingSchema } from "@/lib/engine/busbar-sizing";
import { ChoiceField, Group, NumField, opt, useSheetFormSettings } from "./kit";
import { FINISH_OPTIONS, MATERIAL_OPTIONS, ORIENTATION_OPTIONS, PHASE_OPTIONS } from "./options";
import type { KindModule } from "./types";

function MaterialChoices() {
  const { register, formState } = useFormContext();
  const { readOnly } = useSheetFormSettings();
  const error = (formState.errors.materialIds as { message?: string } | undefined)?.message;
  return (
    <fieldset className="sm:col-span-2 lg:col-span-3" aria-describedby={error ? "materialIds-error" : undefined} aria-invalid={error ? true : undefined}>
      <legend className="field-label">Materials to try</legend>
      <div className="mt-1 flex flex-wrap gap-x-5 gap-y-1">
        {MATERIAL_OPTIONS.map((m) => (
          <label key={m.value} className="inline-flex items-center gap-2 text-sm text-fen-800">
            <input type="checkbox" value={m.value} disabled={readOnly} className="h-4 w-4 rounded border-fen-300" {...register("materialIds")} />
            {m.label}
          </label>
        ))}
      </div>
      {error ? (
        <p id="materialIds-error" className="field-error">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}

/** Busbar sizing: the current and the limits; the result lists standard arrangements that pass. */
function BusbarSizingForm() {
  return (
    <div className="space-y-4">
      <Group title="Duty">
        <NumField path="current_A" label="Required current" />
        <NumField path="frequency_Hz" label="Frequency" unit="Hz" hint="0 for DC" />
        <NumField path="maxTemperature_C" label="Temperature limit of the bars" />
      </Group>
      <Group title="Bars to consider">
        <MaterialChoices />
        <ChoiceField path="series" label="Bar size series" options={[opt("metric", "Metric flat bars (mm)"), opt("inch", "Inch flat bars")]} />
        <ChoiceField path="maxBarsPerPhase" label="Most bars per phase" options={[1, 2, 3, 4].map((n) => opt(String(n), String(n)))} />
        <ChoiceField path="orientation" label="Orientation" options={ORIENTATION_OPTIONS} />
        <ChoiceField path="phases" label="Phases" options={PHASE_OPTIONS} />
        <NumField path="phaseClearance_m" label="Clearance between phase packs" />
        <ChoiceField path="finish" label="Surface finish" options={FINISH_OPTIONS} />
        <NumField path="emissivity" label="Emissivity" hint="Leave empty to use the value of the surface finish" />
      </Group>
      <Group title="Surroundings">
        <NumField path="ambient_C" label="Ambient or enclosure air temperature" />
        <NumField path="altitude_m" label="Altitude" />
      </Group>
      <Group title="Voltage-drop limit (optional)" description="Fill the length, the voltage and the limit to check the drop along the bars; leave all empty to skip.">
        <NumField path="voltageDrop.length_m" label="Busbar length" />
        <NumField path="voltageDrop.systemVoltage_V" label="System voltage" unit="V" />
        <NumField path="voltageDrop.maxPercent" label="Voltage-drop limit" unit="%" />
        <NumField path="voltageDrop.powerFactor" label="Power factor" hint="0.9 when empty" />
      </Group>
      <Group title="Short-time withstand (optional)" description="Fill the current, duration and final temperature to require the adiabatic minimum section; leave all empty to skip.">
        <NumField path="fault.current_A" label="Short-time current Icw" />
        <NumField path="fault.duration_s" label="Duration" unit="s" />
        <NumField path="fault.initialTemperature_C" label="Temperature at the start" hint="The temperature limit above when empty" />
        <NumField path="fault.finalTemperature_C" label="Temperature at the end" />
      </Group>
      <Group title="List">
        <NumField path="maxResults" label="Passing arrangements to list" unit="" />
        <NumField path="maxFailures" label="Failing arrangements to list" unit="" />
      </Group>
    </div>
  );
}

export const busbarSizing: KindModule = { schema: busbarSizingSchema, Form: BusbarSizingForm };
