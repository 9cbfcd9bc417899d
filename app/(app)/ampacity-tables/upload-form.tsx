"use client";

import Link from "next/link";
import { useRouter } from "next/navigation";
import { useRef, useState } from "react";
import { FormAlert } from "@/components/forms/form-alert";
import { formatCsvIssue, type CsvIssue } from "@/lib/engine/ampacity-table";
import { ampacityMetaSchema } from "@/lib/ampacity/upload";
import { fieldErrors } from "@/lib/engine/core/schema";
import { uploadAmpacityTableAction } from "./actions";

type Result =
  | { kind: "stored"; id: number; name: string; version: number; rowCount: number; notes: string[] }
  | { kind: "refused"; message: string; errors: CsvIssue[]; total: number }
  | { kind: "error"; message: string }
  | null;

/**
 * The upload of a table or of its next version. The name and source are checked here and
 * again on the server with the same schema; the file is checked only on the server.
 */
export function UploadForm({ latest }: { latest: { name: string; version: number }[] }) {
  const router = useRouter();
  const formRef = useRef<HTMLFormElement>(null);
  const [name, setName] = useState("");
  const [fields, setFields] = useState<Record<string, string>>({});
  const [result, setResult] = useState<Result>(null);
  const [pending, setPending] = useState(false);
  const existing = latest.find((t) => t.name.toLowerCase() === name.trim().toLowerCase());

  async function submit(form: FormData) {
    setResult(null);
    const meta = ampacityMetaSchema.safeParse({ name: form.get("name") ?? "", source: form.get("source") ?? "" });
    const file = form.get("file");
    const local: Record<string, string> = meta.success ? {} : fieldErrors(meta.error);
    if (!(file instanceof File) || file.size === 0) local.file = "CSV file: choose the table's CSV file";
    setFields(local);
    if (Object.keys(local).length > 0) return;
    setPending(true);
    const r = await uploadAmpacityTableAction(form).catch(() => null);
    setPending(false);
    if (!r) return setResult({ kind: "error", message: "The server could not be reached. Try again." });
    if (!r.ok) {
      setFields(r.error.fields ?? {});
      if (!r.error.fields) setResult({ kind: "error", message: r.error.message });
      return;
    }
    if (r.data.stored) {
      setResult({ kind: "stored", id: r.data.id, name: r.data.name, version: r.data.version, rowCount: r.data.rowCount, notes: r.data.notes });
      formRef.current?.reset();
      setName("");
      router.refresh();
    } else setResult({ kind: "refused", message: r.data.message, errors: r.data.errors, total: r.data.total });
  }

  const err = (k: string) => fields[k];
  const described = (k: string, hint: boolean) => [err(k) ? `${k}-error` : null, hint ? `${k}-hint` : null].filter(Boolean).join(" ") || undefined;

  return (
    <form
      ref={formRef}
      // onSubmit rather than action: a refused upload must keep what was typed and chosen.
      onSubmit={(e) => {
        e.preventDefault();
        void submit(new FormData(e.currentTarget));
      }}
      noValidate
      className="space-y-4"
      aria-label="Upload an ampacity table"
    >
      <div className="grid gap-4 md:grid-cols-2">
        <div>
          <label htmlFor="name" className="field-label">
            Table name
          </label>
          <input
            id="name"
            name="name"
            className="field-input"
            list="ampacity-table-names"
            maxLength={120}
            autoComplete="off"
            value={name}
            onChange={(e) => setName(e.target.value)}
            aria-invalid={err("name") ? true : undefined}
            aria-describedby={described("name", true)}
          />
          <datalist id="ampacity-table-names">
            {latest.map((t) => (
              <option key={t.name} value={t.name} />
            ))}
          </datalist>
          <p id="name-hint" className="field-hint" data-testid="version-hint">
            {existing ? `Uploading adds version ${existing.version + 1} of “${existing.name}”; version ${existing.version} stays readable.` : "A new name starts at version 1; an existing name gets its next version."}
          </p>
          {err("name") ? (
            <p id="name-error" className="field-error">
              {err("name")}
            </p>
          ) : null}
        </div>
        <div>
          <label htmlFor="file" className="field-label">
            CSV file
          </label>
          <input
            id="file"
            name="file"
            type="file"
            accept=".csv,text/csv,text/plain"
            className="field-input"
            aria-invalid={err("file") ? true : undefined}
            aria-describedby={described("file", true)}
          />
          <p id="file-hint" className="field-hint">
            At most 2 MB and 5 000 rows, UTF-8, comma or semicolon separated.{" "}
            <a href="/ampacity-tables/template" className="text-copper-700 underline" download>
              Download the template
            </a>
          </p>
          {err("file") ? (
            <p id="file-error" className="field-error" role="alert">
              {err("file")}
            </p>
          ) : null}
        </div>
      </div>
      <div>
        <label htmlFor="source" className="field-label">
          Source
        </label>
        <textarea
          id="source"
          name="source"
          rows={2}
          maxLength={500}
          className="field-input"
          aria-invalid={err("source") ? true : undefined}
          aria-describedby={described("source", true)}
        />
        <p id="source-hint" className="field-hint">
          The code, edition and table the values come from; sheets and PDFs that use the table print it.
        </p>
        {err("source") ? (
          <p id="source-error" className="field-error">
            {err("source")}
          </p>
        ) : null}
      </div>
      <button type="submit" className="btn-primary" disabled={pending}>
        {pending ? "Checking and uploading…" : "Upload table"}
      </button>

      {result?.kind === "error" ? <FormAlert>{result.message}</FormAlert> : null}
      {result?.kind === "stored" ? (
        <FormAlert tone="success">
          <p data-testid="upload-stored">
            Stored version {result.version} of “{result.name}” with {result.rowCount} rows.{" "}
            <Link href={`/ampacity-tables/${result.id}`} className="font-semibold underline">
              Open it
            </Link>
          </p>
          {result.notes.length ? <p className="mt-1 text-xs">Read as: {result.notes.join(" · ")}.</p> : null}
        </FormAlert>
      ) : null}
      {result?.kind === "refused" ? (
        <FormAlert>
          <p className="font-semibold">{result.message}</p>
          <ul className="mt-2 max-h-80 list-disc space-y-0.5 overflow-auto pl-5 font-mono text-xs" data-testid="upload-errors">
            {result.errors.map((e, i) => (
              <li key={i}>{formatCsvIssue(e)}</li>
            ))}
          </ul>
          {result.total > result.errors.length ? <p className="mt-1 text-xs">… and {result.total - result.errors.length} more problems not listed.</p> : null}
        </FormAlert>
      ) : null}
    </form>
  );
}
