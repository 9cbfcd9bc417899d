"use client";

import { useId, type ComponentProps, type ReactNode } from "react";

/**
 * A labelled multi-line field in the style of components/forms (which has no textarea):
 * the error and hint are tied to it with aria-describedby, aria-invalid marks a refusal.
 */
export function TextAreaField({
  label,
  error,
  hint,
  className,
  id,
  ...textarea
}: { label: ReactNode; error?: string; hint?: ReactNode; className?: string } & Omit<ComponentProps<"textarea">, "className">) {
  const auto = useId();
  const fieldId = id ?? auto;
  const describedBy = [error ? `${fieldId}-error` : null, hint ? `${fieldId}-hint` : null].filter(Boolean).join(" ") || undefined;
  return (
    <div className={className}>
      <label htmlFor={fieldId} className="field-label">
        {label}
      </label>
      <textarea {...textarea} id={fieldId} className="field-input" aria-invalid={error ? true : undefined} aria-describedby={describedBy} />
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
