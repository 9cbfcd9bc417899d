import type { FieldValues, Path, UseFormSetError } from "react-hook-form";

/**
 * Puts a server action's field errors onto a react-hook-form form. Returns the message
 * for the form as a whole when some of it has no field to sit on, else null.
 */
export function applyServerErrors<T extends FieldValues>(
  setError: UseFormSetError<T>,
  error: { message: string; fields?: Record<string, string> },
  fieldNames: readonly Path<T>[],
): string | null {
  const fields = Object.entries(error.fields ?? {});
  let unplaced = fields.length === 0;
  for (const [key, message] of fields) {
    if ((fieldNames as readonly string[]).includes(key)) setError(key as Path<T>, { type: "server", message });
    else unplaced = true;
  }
  return unplaced ? error.message : null;
}
