"use client";

import { useId, useMemo } from "react";
import { get, useFieldArray, useFormContext, useFormState, useWatch, type FieldErrors } from "react-hook-form";
import { z } from "zod";
import type { SelectOption } from "@/components/forms/field";
import { networkInputSchema } from "@/lib/engine/network";
import { networkNodes } from "@/lib/sheets/kinds";
import { unitLabel } from "@/lib/sheets/units";
import { ChoiceField, Group, NumField, opt, useSheetFormSettings } from "./kit";
import { MATERIAL_OPTIONS } from "./options";
import type { KindModule } from "./types";

/**
 * Bus network: the panel's distribution as four tables — conductor specs, segments
 * (each joins two named nodes with a conductor spec and a length), loads on nodes and
 * supplies. The node list is not typed: it is every name the segments use (see
 * `networkNodes`), offered as suggestions in the node cells.
 */

type ColumnKind = "text" | "number" | "select" | "node";

interface Column {
  /** Field of the row ("length_m"). */
  field: string;
  /** Column heading and, with the row, the input's accessible name. */
  label: string;
  kind: ColumnKind;
  options?: readonly SelectOption[];
  /** Fixed unit label (otherwise the unit of the field's quantity in the project's system). */
  unit?: string;
  width: string;
  placeholder?: string;
}

const CELL =
  "block w-full rounded border border-fen-300 bg-white px-2 py-1 text-sm tabular-nums shadow-sm focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-200 aria-[invalid=true]:border-signal-500 aria-[invalid=true]:bg-signal-50";

function errorOf(errors: FieldErrors, path: string): string | undefined {
  const e = get(errors, path) as { message?: unknown } | undefined;
  return typeof e?.message === "string" ? e.message : undefined;
}

/**
 * One table of rows (a field array). Every input is labelled by its row and column
 * ("Segment 3 length"); a row's errors are listed under it, each naming the row and the
 * field, and tied to its input with aria-describedby.
 */
function RowsTable({
  name,
  title,
  rowNoun,
  columns,
  newRow,
  minRows = 0,
  nodeListId,
  description,
}: {
  name: string;
  title: string;
  rowNoun: string;
  columns: readonly Column[];
  newRow: (rows: Record<string, unknown>[]) => Record<string, unknown>;
  minRows?: number;
  nodeListId: string;
  description?: string;
}) {
  const { control, register, getValues } = useFormContext();
  const { kind, unitSystem, readOnly } = useSheetFormSettings();
  const { fields, append, remove } = useFieldArray({ control, name });
  const { errors } = useFormState({ control, name });
  const base = useId();
  const tableError = errorOf(errors, name) ?? errorOf(errors, `${name}.root`);
  const headingId = `${base}-title`;
  return (
    <fieldset className="min-w-0 rounded-lg border border-fen-200 bg-white p-4" data-table={name}>
      <legend id={headingId} className="px-1 text-xs font-semibold uppercase tracking-wider text-fen-500">
        {title} <span className="font-normal normal-case tracking-normal text-fen-400">({fields.length})</span>
      </legend>
      {description ? <p className="mb-2 text-xs text-fen-500">{description}</p> : null}
      {tableError ? (
        <p className="field-error mb-2" role="alert">
          {title}: {tableError}
        </p>
      ) : null}
      <div className="max-h-[28rem] overflow-auto">
        <table className="w-full border-separate border-spacing-x-1 border-spacing-y-0.5 text-sm" aria-labelledby={headingId}>
          <thead className="sticky top-0 z-10 bg-white">
            <tr>
              <th scope="col" className="w-8 px-1 py-1 text-left text-xs font-semibold text-fen-500">
                #
              </th>
              {columns.map((c) => {
                const unit = c.unit ?? unitLabel(kind, `${name}.0.${c.field}`, unitSystem);
                return (
                  <th key={c.field} scope="col" className={`px-1 py-1 text-left text-xs font-semibold text-fen-600 ${c.width}`}>
                    {c.label}
                    {unit ? <span className="font-normal text-fen-500"> ({unit})</span> : null}
                  </th>
                );
              })}
              {!readOnly ? <th className="w-8" aria-label="Remove" /> : null}
            </tr>
          </thead>
          <tbody>
            {fields.map((f, i) => {
              const rowLabel = `${rowNoun} ${i + 1}`;
              const rowErrors = columns.map((c) => ({ c, message: errorOf(errors, `${name}.${i}.${c.field}`) })).filter((x) => x.message);
              return [
                <tr key={f.id} data-row={i}>
                  <td className="px-1 text-right text-xs text-fen-400">{i + 1}</td>
                  {columns.map((c) => {
                    const path = `${name}.${i}.${c.field}`;
                    const message = errorOf(errors, path);
                    const unit = c.unit ?? unitLabel(kind, path, unitSystem);
                    const common = {
                      "aria-label": `${rowLabel} ${c.label.toLowerCase()}${unit ? ` (${unit})` : ""}`,
                      "aria-invalid": message ? true : undefined,
                      "aria-describedby": message ? `${base}-${i}-${c.field}-error` : undefined,
                      "data-path": path,
                      className: CELL,
                      ...register(path),
                    };
                    return (
                      <td key={c.field} className="py-0.5">
                        {c.kind === "select" ? (
                          <select {...common}>
                            {(c.options ?? []).map((o) => (
                              <option key={o.value} value={o.value}>
                                {o.label}
                              </option>
                            ))}
                          </select>
                        ) : (
                          <input
                            {...common}
                            autoComplete="off"
                            spellCheck={false}
                            placeholder={c.placeholder}
                            inputMode={c.kind === "number" ? "decimal" : undefined}
                            list={c.kind === "node" ? nodeListId : undefined}
                          />
                        )}
                      </td>
                    );
                  })}
                  {!readOnly ? (
                    <td className="py-0.5">
                      <button
                        type="button"
                        className="rounded px-1.5 py-1 text-fen-400 hover:bg-signal-50 hover:text-signal-700 disabled:opacity-30"
                        aria-label={`Remove ${rowLabel.toLowerCase()}`}
                        title={`Remove ${rowLabel.toLowerCase()}`}
                        disabled={fields.length <= minRows}
                        onClick={() => remove(i)}
                      >
                        ×
                      </button>
                    </td>
                  ) : null}
                </tr>,
                rowErrors.length > 0 ? (
                  <tr key={`${f.id}-errors`}>
                    <td />
                    <td colSpan={columns.length + (readOnly ? 0 : 1)}>
                      <ul className="mb-1 space-y-0.5 text-xs text-signal-700">
                        {rowErrors.map(({ c, message }) => (
                          <li key={c.field} id={`${base}-${i}-${c.field}-error`}>
                            {rowLabel}, {c.label.toLowerCase()}: {message}
                          </li>
                        ))}
                      </ul>
                    </td>
                  </tr>
                ) : null,
              ];
            })}
          </tbody>
        </table>
      </div>
      {!readOnly ? (
        <button type="button" className="btn-secondary mt-3" onClick={() => append(newRow((getValues(name) as Record<string, unknown>[] | undefined) ?? []))}>
          Add {rowNoun.toLowerCase()}
        </button>
      ) : null}
    </fieldset>
  );
}

/** The next free id "<prefix><n>" among the rows' values of `field`. */
function nextId(rows: readonly Record<string, unknown>[], field: string, prefix: string): string {
  const taken = new Set(rows.map((r) => String(r[field] ?? "")));
  for (let n = rows.length + 1; ; n++) if (!taken.has(`${prefix}${n}`)) return `${prefix}${n}`;
}

function BusNetworkForm() {
  const { control } = useFormContext();
  const mode = useWatch({ control, name: "mode" }) as string | undefined;
  const segments = useWatch({ control, name: "segments" }) as Record<string, unknown>[] | undefined;
  const supplies = useWatch({ control, name: "supplies" }) as Record<string, unknown>[] | undefined;
  const conductors = useWatch({ control, name: "conductors" }) as Record<string, unknown>[] | undefined;
  const nodeListId = useId();
  const nodes = useMemo(() => networkNodes({ segments, supplies }), [segments, supplies]);
  const conductorOptions = useMemo(() => {
    const ids = (conductors ?? []).map((c) => String(c.id ?? "").trim()).filter(Boolean);
    return [...new Set(ids)].map((id) => opt(id, id));
  }, [conductors]);

  const conductorColumns: Column[] = [
    { field: "id", label: "Id", kind: "text", width: "min-w-[5.5rem]" },
    { field: "materialId", label: "Material", kind: "select", options: MATERIAL_OPTIONS, width: "min-w-[10rem]" },
    { field: "area_m2", label: "Cross-section", kind: "number", width: "min-w-[5rem]", placeholder: "bars" },
    { field: "count", label: "In parallel", kind: "number", width: "min-w-[3.5rem]", unit: "", placeholder: "1" },
    { field: "conductorTemperature_C", label: "Conductor temperature", kind: "number", width: "min-w-[5rem]" },
    { field: "reactance_ohm_per_m", label: "Reactance", kind: "number", width: "min-w-[4.5rem]" },
    { field: "ampacity_A", label: "Ampacity", kind: "number", width: "min-w-[4.5rem]" },
  ];
  const segmentColumns: Column[] = [
    { field: "id", label: "Id", kind: "text", width: "min-w-[5.5rem]" },
    { field: "from", label: "From node", kind: "node", width: "min-w-[6rem]" },
    { field: "to", label: "To node", kind: "node", width: "min-w-[6rem]" },
    { field: "conductor", label: "Conductor", kind: "select", options: conductorOptions, width: "min-w-[6.5rem]" },
    { field: "length_m", label: "Length", kind: "number", width: "min-w-[5rem]" },
  ];
  const loadColumns: Column[] = [
    { field: "node", label: "Node", kind: "node", width: "w-32" },
    { field: "current_A", label: "Current", kind: "number", width: "w-28" },
    ...(mode === "dc" ? [] : [{ field: "pf", label: "Power factor", kind: "number" as const, width: "w-24", unit: "" }]),
  ];
  const supplyColumns: Column[] = [
    { field: "node", label: "Node", kind: "node", width: "w-32" },
    { field: "voltage_V", label: "Voltage", kind: "number", width: "w-28", unit: "V" },
  ];

  return (
    <div className="space-y-4">
      <datalist id={nodeListId}>
        {nodes.map((n) => (
          <option key={n.id} value={n.id} />
        ))}
      </datalist>
      <Group title="System" description="Per-phase model: each segment is one phase conductor (or identical ones in parallel); voltages are phase voltages.">
        <ChoiceField path="mode" label="Current" options={[opt("ac", "AC (impedances)"), opt("dc", "DC (resistances)")]} />
        {mode === "dc" ? null : <NumField path="frequency_Hz" label="Frequency" unit="Hz" />}
        <NumField path="ambient_C" label="Ambient temperature" />
        <NumField path="maxTemperature_C" label="Maximum conductor temperature" />
        <NumField path="dropLimit_pct" label="Voltage drop limit" unit="%" hint="Optional: adds a pass/fail check" />
      </Group>
      <RowsTable
        name="supplies"
        title="Supplies"
        rowNoun="Supply"
        columns={supplyColumns}
        minRows={1}
        nodeListId={nodeListId}
        description="Nodes held at a fixed voltage: the incomer (and any second feed)."
        newRow={(rows) => ({ node: "", voltage_V: String(rows.at(-1)?.voltage_V ?? "230"), angle_deg: "0" })}
      />
      <RowsTable
        name="conductors"
        title="Conductors"
        rowNoun="Conductor"
        columns={conductorColumns}
        minRows={1}
        nodeListId={nodeListId}
        description="Specs the segments refer to by id. Reactance and ampacity are optional; the ampacity gives utilisation, pass/fail and the temperature rise."
        newRow={(rows) => ({ ...(rows.at(-1) ?? { materialId: "cu-annealed", conductorTemperature_C: "70" }), arrangement: undefined, id: nextId(rows, "id", "C") })}
      />
      <RowsTable
        name="segments"
        title="Segments"
        rowNoun="Segment"
        columns={segmentColumns}
        nodeListId={nodeListId}
        description="Main-bus sections, droppers and tap-offs. A node exists once a segment names it."
        newRow={(rows) => {
          const last = rows.at(-1);
          return { id: nextId(rows, "id", "S-"), from: String(last?.to ?? ""), to: nextId(nodes.map((n) => ({ id: n.id })), "id", "N"), conductor: String(last?.conductor ?? conductorOptions[0]?.value ?? ""), length_m: String(last?.length_m ?? "1") };
        }}
      />
      <RowsTable
        name="loads"
        title="Loads"
        rowNoun="Load"
        columns={loadColumns}
        nodeListId={nodeListId}
        description={mode === "dc" ? "Constant-current loads on nodes." : "Constant-current loads on nodes, lagging power factor."}
        newRow={(rows) => ({ node: "", current_A: String(rows.at(-1)?.current_A ?? "10"), pf: String(rows.at(-1)?.pf ?? "0.85"), leading: false })}
      />
    </div>
  );
}

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);

/** The engine schema with the node list derived from the segments, as the editor completes the inputs. */
const formSchema = z.preprocess((v) => (isRecord(v) ? { ...v, nodes: networkNodes(v) } : v), networkInputSchema);

export const busNetworkKind: KindModule = { schema: formSchema, Form: BusNetworkForm };
