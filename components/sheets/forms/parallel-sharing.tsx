"use client";

import { useFieldArray, useFormContext } from "react-hook-form";
import { parallelSharing, parallelSharingInputSchema } from "@/lib/engine/parallel";
import { ChoiceField, Group, NumField, opt, TextField, useSheetFormSettings } from "./kit";
import { MATERIAL_OPTIONS } from "./options";
import type { KindModule } from "./types";

/** Parallel sharing: the total current and two or more paths between the same two points. */
function ParallelSharingForm() {
  const { control, getValues } = useFormContext();
  const { readOnly } = useSheetFormSettings();
  const { fields, append, remove } = useFieldArray({ control, name: "paths" });
  return (
    <div className="space-y-4">
      <Group title="Circuit">
        <ChoiceField path="mode" label="Current" options={[opt("ac", "AC (impedances)"), opt("dc", "DC (resistances)")]} />
        <NumField path="current_A" label="Total current" />
        <NumField path="ambient_C" label="Ambient temperature" />
        <NumField path="maxTemperature_C" label="Maximum conductor temperature" />
      </Group>
      <fieldset className="rounded-lg border border-fen-200 bg-white p-4">
        <legend className="px-1 text-xs font-semibold uppercase tracking-wider text-fen-500">Parallel paths</legend>
        <ol className="space-y-3">
          {fields.map((f, i) => (
            <li key={f.id} className="rounded-md border border-fen-100 p-3">
              <div className="mb-2 flex items-center justify-between text-xs text-fen-500">
                <span>Path {i + 1}</span>
                {!readOnly && fields.length > 2 ? (
                  <button type="button" className="text-signal-700 hover:underline" onClick={() => remove(i)} aria-label={`Remove path ${i + 1}`}>
                    Remove
                  </button>
                ) : null}
              </div>
              <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
                <TextField path={`paths.${i}.name`} label="Name" />
                <ChoiceField path={`paths.${i}.materialId`} label="Material" options={MATERIAL_OPTIONS} />
                <NumField path={`paths.${i}.area_m2`} label="Cross-section" />
                <NumField path={`paths.${i}.length_m`} label="Length" />
                <NumField path={`paths.${i}.count`} label="Conductors in parallel" unit="" />
                <NumField path={`paths.${i}.conductorTemperature_C`} label="Conductor temperature" />
                <NumField path={`paths.${i}.reactance_ohm_per_m`} label="Reactance" />
                <NumField path={`paths.${i}.acResistanceFactor`} label="Rac/Rdc" unit="" />
                <NumField path={`paths.${i}.ampacityPerConductor_A`} label="Ampacity per conductor" hint="Optional: gives utilisation and temperature" />
                <NumField path={`paths.${i}.maxTemperature_C`} label="Maximum temperature of this path" hint="The circuit's maximum when empty" />
              </div>
            </li>
          ))}
        </ol>
        {!readOnly ? (
          <button
            type="button"
            className="btn-secondary mt-3"
            onClick={() => {
              const last = (getValues("paths") as Record<string, unknown>[] | undefined)?.at(-1) ?? {};
              append({ ...last, name: `Path ${fields.length + 1}` });
            }}
          >
            Add a path
          </button>
        ) : null}
      </fieldset>
    </div>
  );
}

export const parallelSharingKind: KindModule = { schema: parallelSharingInputSchema, run: parallelSharing as KindModule["run"], Form: ParallelSharingForm };
