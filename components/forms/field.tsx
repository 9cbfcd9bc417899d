"use client";

import { useId, type ComponentProps, type ReactNode } from "react";

/**
 * Labelled form controls. The error and the hint are tied to the control with
 * aria-describedby, and aria-invalid marks a control whose value was refused.
 * Spread react-hook-form's `register(name)` into them (React 19 passes `ref` as a prop).
 */
interface FieldProps {
  label: ReactNode;
  error?: string;
  hint?: ReactNode;
  /** Class of the wrapping element (layout); the control keeps `field-input`. */
  className?: string;
}

function useFieldIds(id: string | undefined, error: string | undefined, hint: ReactNode, extra?: string) {
  const auto = useId();
  const fieldId = id ?? auto;
  const describedBy = [error ? `${fieldId}-error` : null, hint ? `${fieldId}-hint` : null, extra ?? null].filter(Boolean).join(" ") || undefined;
  return { fieldId, describedBy };
}

function Frame({ fieldId, label, error, hint, className, children }: FieldProps & { fieldId: string; children: ReactNode }) {
  return (
    <div className={className}>
      <label htmlFor={fieldId} className="field-label">
        {label}
      </label>
      {children}
      {hint ? (
        <p id={`${fieldId}-hint`} className="field-hint">
          {hint}
        </p>
      ) : null}
      {error ? (
        <p id={`${fieldId}-error`} className="field-error">
          {error}
        </p>
      ) : null}
    </div>
  );
}

export function InputField({ label, error, hint, className, id, ...input }: FieldProps & Omit<ComponentProps<"input">, "className">) {
  const { fieldId, describedBy } = useFieldIds(id, error, hint, input["aria-describedby"]);
  return (
    <Frame fieldId={fieldId} label={label} error={error} hint={hint} className={className}>
      <input {...input} id={fieldId} className="field-input" aria-invalid={error ? true : undefined} aria-describedby={describedBy} />
    </Frame>
  );
}

export interface SelectOption {
  value: string;
  label: string;
}

export function SelectField({
  label,
  error,
  hint,
  className,
  id,
  options,
  ...select
}: FieldProps & Omit<ComponentProps<"select">, "className" | "children"> & { options: readonly SelectOption[] }) {
  const { fieldId, describedBy } = useFieldIds(id, error, hint, select["aria-describedby"]);
  return (
    <Frame fieldId={fieldId} label={label} error={error} hint={hint} className={className}>
      <select {...select} id={fieldId} className="field-input" aria-invalid={error ? true : undefined} aria-describedby={describedBy}>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
    </Frame>
  );
}

export function TextAreaField({ label, error, hint, className, id, ...textarea }: FieldProps & Omit<ComponentProps<"textarea">, "className">) {
  const { fieldId, describedBy } = useFieldIds(id, error, hint, textarea["aria-describedby"]);
  return (
    <Frame fieldId={fieldId} label={label} error={error} hint={hint} className={className}>
      <textarea {...textarea} id={fieldId} className="field-input" aria-invalid={error ? true : undefined} aria-describedby={describedBy} />
    </Frame>
  );
}
