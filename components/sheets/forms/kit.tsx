"use client";

import { createContext, useContext, useId, type ReactNode } from "react";
import { get, useFormContext, useFormState } from "react-hook-form";
import { InputField, SelectField, type SelectOption } from "@/components/forms/field";
import { unitLabel, type UnitSystem } from "@/lib/sheets/units";

/**
 * The pieces every sheet form is built from. A field is named by its engine input path
 * ("arrangement.barWidth_m"); its unit comes from lib/sheets/units for the project's
 * unit system, and its error from the form state (already in the user's units).
 */
export interface SheetFormSettings {
  kind: string;
  unitSystem: UnitSystem;
  readOnly: boolean;
}

const SheetFormContext = createContext<SheetFormSettings>({ kind: "", unitSystem: "metric", readOnly: true });

export function SheetFormSettingsProvider({ value, children }: { value: SheetFormSettings; children: ReactNode }) {
  return <SheetFormContext.Provider value={value}>{children}</SheetFormContext.Provider>;
}

export function useSheetFormSettings(): SheetFormSettings {
  return useContext(SheetFormContext);
}

function useFieldError(path: string): string | undefined {
  const { control } = useFormContext();
  const { errors } = useFormState({ control, name: path });
  const e = get(errors, path) as { message?: unknown } | undefined;
  return typeof e?.message === "string" ? e.message : undefined;
}

function LabelWithUnit({ label, unit }: { label: ReactNode; unit?: string }) {
  return (
    <>
      {label}
      {unit ? <span className="font-normal text-fen-500"> ({unit})</span> : null}
    </>
  );
}

/** A number typed as text (the schema parses it), with its unit beside the label. */
export function NumField({ path, label, hint, unit, className }: { path: string; label: string; hint?: ReactNode; unit?: string; className?: string }) {
  const { register } = useFormContext();
  const { kind, unitSystem } = useSheetFormSettings();
  const error = useFieldError(path);
  const shown = unit ?? unitLabel(kind, path, unitSystem);
  return (
    <InputField
      label={<LabelWithUnit label={label} unit={shown} />}
      error={error}
      hint={hint}
      className={className}
      inputMode="decimal"
      autoComplete="off"
      spellCheck={false}
      data-path={path}
      {...register(path)}
    />
  );
}

/** Free text (names, tags). */
export function TextField({ path, label, hint, className }: { path: string; label: string; hint?: ReactNode; className?: string }) {
  const { register } = useFormContext();
  const error = useFieldError(path);
  return <InputField label={label} error={error} hint={hint} className={className} autoComplete="off" data-path={path} {...register(path)} />;
}

export function ChoiceField({
  path,
  label,
  options,
  hint,
  className,
}: {
  path: string;
  label: string;
  options: readonly SelectOption[];
  hint?: ReactNode;
  className?: string;
}) {
  const { register } = useFormContext();
  const error = useFieldError(path);
  return <SelectField label={label} error={error} hint={hint} className={className} options={options} data-path={path} {...register(path)} />;
}

export function CheckField({ path, label, hint }: { path: string; label: string; hint?: ReactNode }) {
  const { register } = useFormContext();
  const error = useFieldError(path);
  const id = useId();
  return (
    <div className="flex items-start gap-2 pt-6">
      <input
        id={id}
        type="checkbox"
        className="mt-0.5 h-4 w-4 rounded border-fen-300 text-copper-600 focus:ring-copper-500"
        aria-invalid={error ? true : undefined}
        aria-describedby={[error ? `${id}-error` : null, hint ? `${id}-hint` : null].filter(Boolean).join(" ") || undefined}
        data-path={path}
        {...register(path)}
      />
      <div>
        <label htmlFor={id} className="text-sm font-medium text-fen-800">
          {label}
        </label>
        {hint ? (
          <p id={`${id}-hint`} className="field-hint">
            {hint}
          </p>
        ) : null}
        {error ? (
          <p id={`${id}-error`} className="field-error">
            {error}
          </p>
        ) : null}
      </div>
    </div>
  );
}

/** A titled group of fields in a responsive grid. */
export function Group({ title, children, description }: { title: string; children: ReactNode; description?: ReactNode }) {
  return (
    <fieldset className="rounded-lg border border-fen-200 bg-white p-4">
      <legend className="px-1 text-xs font-semibold uppercase tracking-wider text-fen-500">{title}</legend>
      {description ? <p className="mb-3 text-xs text-fen-500">{description}</p> : null}
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">{children}</div>
    </fieldset>
  );
}

/** Form-level errors that sit on no field ("_" or a path the form does not show). */
export function UnplacedErrors({ messages }: { messages: string[] }) {
  if (messages.length === 0) return null;
  return (
    <ul role="alert" className="rounded-md border border-signal-500/40 bg-signal-50 px-3 py-2 text-sm text-signal-700">
      {messages.map((m, i) => (
        <li key={i}>{m}</li>
      ))}
    </ul>
  );
}

export const opt = (value: string, label: string): SelectOption => ({ value, label });
