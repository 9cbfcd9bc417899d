"use client";

import type { ComponentProps, ReactNode } from "react";

/** A submit button that shows it is working and cannot be pressed twice meanwhile. */
export function SubmitButton({
  pending,
  pendingLabel,
  variant = "primary",
  children,
  className = "",
  disabled,
  ...button
}: Omit<ComponentProps<"button">, "type"> & { pending: boolean; pendingLabel?: ReactNode; variant?: "primary" | "secondary" | "danger" }) {
  return (
    <button {...button} type="submit" className={`btn-${variant} ${className}`} disabled={pending || disabled} aria-busy={pending || undefined}>
      {pending ? (
        <>
          <span aria-hidden="true" className="h-3.5 w-3.5 animate-spin rounded-full border-2 border-current border-r-transparent" />
          {pendingLabel ?? children}
        </>
      ) : (
        children
      )}
    </button>
  );
}
