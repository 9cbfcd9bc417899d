"use client";

import { useState } from "react";
import { useFieldArray, useFormContext } from "react-hook-form";
import { sig } from "@/lib/engine/format";
import { calcEnclosureHeat, enclosureHeatSchema } from "@/lib/engine/enclosure-heat";
import { displayUnit, toSIQuantity } from "@/lib/sheets/units";
import { sheetKindName } from "@/lib/sheets/kinds";
import { ChoiceField, Group, NumField, opt, TextField, useSheetFormSettings } from "./kit";
import type { KindModule, LossSource, SheetFormProps } from "./types";

const INSTALLATIONS = [
  opt("free-standing", "Free-standing, all sides exposed"),
  opt("wall", "Against a wall"),
  opt("row-end", "End of a row"),
  opt("row-end-wall", "End of a row, against a wall"),
  opt("row-centre", "Inside a row"),
  opt("row-centre-wall", "Inside a row, against a wall"),
  opt("built-in", "Built in (front exposed only)"),
];

interface Row {
  name: string;
  loss_W: string;
  quantity: string;
  loadFactor: string;
  sourceSheet?: string;
}

/** Losses of the other sheets: a busbar's W/m times a length entered here, a feeder's loss as given. */
function FromSheets({ sources, onAdd }: { sources: readonly LossSource[]; onAdd: (row: Row) => void }) {
  const { unitSystem, readOnly } = useSheetFormSettings();
  const [lengths, setLengths] = useState<Record<number, string>>({});
  const lenUnit = displayUnit("length", unitSystem).label;
  if (readOnly) return null;
  if (sources.length === 0)
    return <p className="text-sm text-fen-500">No busbar rating or feeder sheet of this project has a computed loss yet.</p>;
  return (
    <ul className="divide-y divide-fen-100">
      {sources.map((s) => {
        const len = lengths[s.sheetId] ?? "";
        const len_m = toSIQuantity("length", unitSystem, len);
        const perPhase = s.lossPerMetre_W_m;
        return (
          <li key={s.sheetId} className="flex flex-wrap items-end gap-3 py-2 text-sm">
            <div className="min-w-48 flex-1">
              <div className="font-medium text-fen-900">
                <span className="font-mono">{s.tag}</span> rev {s.label} · {s.title}
              </div>
              <div className="text-xs text-fen-500">
                {sheetKindName(s.kind)}
                {perPhase !== undefined ? ` · ${sig(perPhase, 3)} W/m per phase × ${s.phases ?? 1} phase${(s.phases ?? 1) > 1 ? "s" : ""}` : ""}
                {s.feederLoss_W !== undefined ? ` · feeder loss ${sig(s.feederLoss_W, 3)} W` : ""}
              </div>
            </div>
            {perPhase !== undefined ? (
              <>
                <label className="text-xs text-fen-700">
                  Length inside the enclosure ({lenUnit})
                  <input
                    className="field-input w-28"
                    inputMode="decimal"
                    value={len}
                    onChange={(e) => setLengths((l) => ({ ...l, [s.sheetId]: e.target.value }))}
                  />
                </label>
                <button
                  type="button"
                  className="btn-secondary"
                  disabled={len_m === undefined || !(len_m > 0)}
                  onClick={() => {
                    onAdd({
                      name: `${s.tag} busbars, ${len} ${lenUnit} per phase`,
                      loss_W: sig(perPhase * (len_m ?? 0), 4),
                      quantity: String(s.phases ?? 1),
                      loadFactor: "1",
                      sourceSheet: s.tag,
                    });
                    setLengths((l) => ({ ...l, [s.sheetId]: "" }));
                  }}
                >
                  Add {s.tag}
                </button>
              </>
            ) : (
              <button
                type="button"
                className="btn-secondary"
                onClick={() => onAdd({ name: `${s.tag} feeder`, loss_W: sig(s.feederLoss_W ?? 0, 4), quantity: "1", loadFactor: "1", sourceSheet: s.tag })}
              >
                Add {s.tag}
              </button>
            )}
          </li>
        );
      })}
    </ul>
  );
}

/** Enclosure heat budget: the enclosure, its surroundings, and the loss rows. */
function EnclosureHeatForm({ lossSources = [] }: SheetFormProps) {
  const { control } = useFormContext();
  const { readOnly } = useSheetFormSettings();
  const { fields, append, remove } = useFieldArray({ control, name: "losses" });
  return (
    <div className="space-y-4">
      <Group title="Enclosure">
        <NumField path="width_m" label="Width" />
        <NumField path="height_m" label="Height" />
        <NumField path="depth_m" label="Depth" />
        <ChoiceField path="installation" label="Installation" options={INSTALLATIONS} />
        <NumField path="heatTransfer_W_m2K" label="Heat-transfer coefficient" unit="W/(m²·K)" hint="5.5 for painted sheet steel" />
        <NumField path="ratedCurrent_A" label="Rated current of the assembly" hint="Optional: checks the scope of the calculation method" />
      </Group>
      <Group title="Temperatures">
        <NumField path="ambient_C" label="Ambient air temperature" />
        <NumField path="targetInternal_C" label="Highest internal air temperature" hint="E.g. the devices' rated ambient" />
        <NumField path="topFactor" label="Top-of-enclosure factor c" unit="" hint="Optional: gives the air temperature at the top" />
      </Group>
      <fieldset className="rounded-lg border border-fen-200 bg-white p-4">
        <legend className="px-1 text-xs font-semibold uppercase tracking-wider text-fen-500">Power losses</legend>
        {fields.length === 0 ? <p className="mb-3 text-sm text-fen-500">No losses yet: add device rows, or take them from the project&apos;s other sheets below.</p> : null}
        <ol className="space-y-3">
          {fields.map((f, i) => (
            <LossRow key={f.id} index={i} onRemove={() => remove(i)} readOnly={readOnly} />
          ))}
        </ol>
        {!readOnly ? (
          <button type="button" className="btn-secondary mt-3" onClick={() => append({ name: "", loss_W: "", quantity: "1", loadFactor: "1" } satisfies Row)}>
            Add a device row
          </button>
        ) : null}
        {!readOnly ? (
          <div className="mt-5 border-t border-fen-100 pt-3">
            <h3 className="mb-1 text-xs font-semibold uppercase tracking-wider text-fen-500">From this project&apos;s sheets</h3>
            <FromSheets sources={lossSources} onAdd={(row) => append(row)} />
          </div>
        ) : null}
      </fieldset>
    </div>
  );
}

function LossRow({ index, onRemove, readOnly }: { index: number; onRemove: () => void; readOnly: boolean }) {
  const { getValues } = useFormContext();
  const source = getValues(`losses.${index}.sourceSheet`) as string | undefined;
  return (
    <li className="rounded-md border border-fen-100 p-3">
      <div className="mb-2 flex items-center justify-between text-xs text-fen-500">
        <span>
          Row {index + 1}
          {source ? (
            <>
              {" "}
              · from sheet <span className="font-mono font-semibold text-copper-700">{source}</span>
            </>
          ) : (
            " · device entered here"
          )}
        </span>
        {!readOnly ? (
          <button type="button" className="text-signal-700 hover:underline" onClick={onRemove} aria-label={`Remove loss row ${index + 1}`}>
            Remove
          </button>
        ) : null}
      </div>
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
        <TextField path={`losses.${index}.name`} label="Item" className="lg:col-span-1" />
        <NumField path={`losses.${index}.loss_W`} label="Loss of one item" unit="W" />
        <NumField path={`losses.${index}.quantity`} label="Quantity" unit="" />
        <NumField path={`losses.${index}.loadFactor`} label="Load factor IB/In" unit="" hint="The loss scales with its square" />
      </div>
    </li>
  );
}

export const enclosureHeat: KindModule = { schema: enclosureHeatSchema, run: calcEnclosureHeat as KindModule["run"], Form: EnclosureHeatForm };
