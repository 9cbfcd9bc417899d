"use client";

import { useCallback, useRef, useState, type FormEvent } from "react";
import type { z } from "zod";

/**
 * A small form hook for plain forms (text inputs and selects, read with FormData) that
 * validates with the same zod schema as the server, loaded on demand: the schema module
 * (and zod with it) is fetched when the user first focuses a field of the form, so the
 * first paint of the page does not wait for it. Errors are shown after the first submit
 * and then follow each change, like react-hook-form's default (validate on submit,
 * revalidate on change). The first message of each field is kept.
 *
 * `opts.preload` starts loading anything else the submit will need at the same moment.
 *
 * Usage: `const f = useSchemaForm(() => import("./schema").then((m) => m.loginSchema))`,
 * `<form {...f.formProps(onValid)}>`, and `error={f.errors.email}` on each field.
 */
export type SchemaLoader<S extends z.ZodType> = () => Promise<S>;
export type FieldErrors = Partial<Record<string, string>>;

function firstErrors(error: z.ZodError): FieldErrors {
  const out: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.length ? issue.path.map(String).join(".") : "_";
    if (!(key in out)) out[key] = issue.message;
  }
  return out;
}

function valuesOf(form: HTMLFormElement): Record<string, string> {
  const out: Record<string, string> = {};
  for (const [k, v] of new FormData(form)) if (typeof v === "string") out[k] = v;
  return out;
}

export function useSchemaForm<S extends z.ZodType>(load: SchemaLoader<S>, opts: { preload?: () => Promise<unknown> } = {}) {
  const [errors, setErrors] = useState<FieldErrors>({});
  const [pending, setPending] = useState(false);
  const submitted = useRef(false);
  const schema = useRef<Promise<S> | null>(null);

  const loadSchema = useCallback(() => {
    schema.current ??= load().catch((err: unknown) => {
      schema.current = null;
      throw err;
    });
    return schema.current;
  }, [load]);

  const validate = useCallback(
    async (form: HTMLFormElement): Promise<{ ok: true; data: z.output<S> } | { ok: false; errors: FieldErrors }> => {
      const parsed = (await loadSchema()).safeParse(valuesOf(form));
      return parsed.success ? { ok: true, data: parsed.data } : { ok: false, errors: firstErrors(parsed.error) };
    },
    [loadSchema],
  );

  /** Props for the <form>: submit handling, on-demand schema loading and revalidation. */
  function formProps(onValid: (data: z.output<S>, form: HTMLFormElement) => Promise<void>, onLoadError?: () => void) {
    return {
      noValidate: true,
      onFocus: () => {
        void loadSchema().catch(() => undefined);
        void opts.preload?.().catch(() => undefined);
      },
      onChange: (e: FormEvent<HTMLFormElement>) => {
        if (!submitted.current) return;
        const form = e.currentTarget;
        void validate(form).then((r) => setErrors(r.ok ? {} : r.errors), () => undefined);
      },
      onSubmit: async (e: FormEvent<HTMLFormElement>) => {
        e.preventDefault();
        if (pending) return;
        submitted.current = true;
        const form = e.currentTarget;
        setPending(true);
        try {
          let r: Awaited<ReturnType<typeof validate>>;
          try {
            r = await validate(form);
          } catch {
            onLoadError?.();
            return;
          }
          setErrors(r.ok ? {} : r.errors);
          if (!r.ok) {
            // Like react-hook-form: the first field in error gets the focus.
            const first = Array.from(form.elements).find((el) => el instanceof HTMLElement && "name" in el && r.errors[(el as HTMLInputElement).name]);
            (first as HTMLElement | undefined)?.focus();
            return;
          }
          await onValid(r.data, form);
        } finally {
          setPending(false);
        }
      },
    };
  }

  /** Puts the server's field errors on the fields; returns the message for the form when some have no field. */
  function applyServerErrors(error: { message: string; fields?: Record<string, string> }, fieldNames: readonly string[]): string | null {
    const fields = Object.entries(error.fields ?? {});
    const placed: FieldErrors = {};
    let unplaced = fields.length === 0;
    for (const [key, message] of fields) {
      if (fieldNames.includes(key)) placed[key] = message;
      else unplaced = true;
    }
    setErrors(placed);
    return unplaced ? error.message : null;
  }

  return { errors, pending, formProps, applyServerErrors };
}
