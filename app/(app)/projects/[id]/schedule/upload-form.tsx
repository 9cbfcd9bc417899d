"use client";

import { useRouter } from "next/navigation";
import { useId, useState } from "react";
import { fieldErrors } from "@/lib/engine/core/schema";
import { scheduleUploadSchema } from "@/lib/schedules/form";
import { MAX_FILE_BYTES, MAX_FILE_LABEL, MAX_ROWS } from "@/lib/schedules/types";
import { uploadScheduleAction } from "./actions";

export interface TableChoice {
  id: number;
  label: string;
}

export interface LimitChoice {
  id: string;
  label: string;
}

/**
 * The upload: the CSV file, the organisation table that rows with an installation
 * method look up, and the voltage-drop limit. The fields are checked here with the same
 * schema as on the server; the server also reads the file and answers with its counts.
 */
export function ScheduleUploadForm({ projectId, tables, limits, defaultLimitId }: { projectId: number; tables: readonly TableChoice[]; limits: readonly LimitChoice[]; defaultLimitId: string }) {
  const router = useRouter();
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [message, setMessage] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  const ids = { file: useId(), table: useId(), limit: useId(), percent: useId() };
  const describe = (key: string, id: string, hint = true) => [errors[key] ? `${id}-error` : null, hint ? `${id}-hint` : null].filter(Boolean).join(" ") || undefined;

  async function submit(form: FormData) {
    setErrors({});
    setMessage(null);
    setDone(null);
    const local: Record<string, string> = {};
    const file = form.get("file");
    if (!(file instanceof File) || file.size === 0) local.file = "Cable schedule file: choose a CSV file";
    else if (file.size > MAX_FILE_BYTES) local.file = `The file is ${(file.size / (1024 * 1024)).toFixed(1)} MB; the limit is ${MAX_FILE_LABEL}. Split the schedule into smaller files.`;
    const parsed = scheduleUploadSchema.safeParse({ projectId, tableId: form.get("tableId"), limitId: form.get("limitId"), limitPercent: form.get("limitPercent") });
    if (!parsed.success) Object.assign(local, fieldErrors(parsed.error));
    if (Object.keys(local).length) {
      setErrors(local);
      return;
    }
    setPending(true);
    try {
      const r = await uploadScheduleAction(form);
      if (r.ok) {
        const d = r.data;
        const errs = d.errorCount === 0 ? "no row errors" : `${d.errorCount} row error${d.errorCount === 1 ? "" : "s"} listed below`;
        setDone(`Uploaded: ${d.rowCount} row${d.rowCount === 1 ? "" : "s"}, ${d.validCount} computed (${d.failCount} failing), ${errs}.`);
        router.refresh();
      } else {
        setErrors(r.error.fields ?? {});
        setMessage(r.error.fields?.file ? null : r.error.message);
      }
    } catch {
      setMessage("The upload did not reach the server; check the connection and try again.");
    } finally {
      setPending(false);
    }
  }

  return (
    <form action={submit} className="grid gap-4 md:grid-cols-2" aria-describedby={message ? "upload-message" : undefined} noValidate>
      <input type="hidden" name="projectId" value={projectId} />
      <div className="md:col-span-2">
        <label htmlFor={ids.file} className="field-label">
          Schedule file (CSV)
        </label>
        <input
          id={ids.file}
          name="file"
          type="file"
          accept=".csv,text/csv"
          className="field-input"
          aria-invalid={errors.file ? true : undefined}
          aria-describedby={describe("file", ids.file)}
        />
        <p id={`${ids.file}-hint`} className="field-hint">
          UTF-8 CSV (with or without a byte order mark), comma or semicolon separated; at most {MAX_FILE_LABEL} and {MAX_ROWS.toLocaleString("en-GB")} rows. Units may be given in the headers, e.g. length [ft] or size (kcmil).
        </p>
        {errors.file ? (
          <p id={`${ids.file}-error`} className="field-error" role="alert">
            {errors.file}
          </p>
        ) : null}
      </div>
      <div>
        <label htmlFor={ids.table} className="field-label">
          Organisation ampacity table
        </label>
        <select id={ids.table} name="tableId" className="field-input" defaultValue="" aria-invalid={errors.tableId ? true : undefined} aria-describedby={describe("tableId", ids.table)}>
          <option value="">None (ampacities given in the file)</option>
          {tables.map((t) => (
            <option key={t.id} value={t.id}>
              {t.label}
            </option>
          ))}
        </select>
        <p id={`${ids.table}-hint`} className="field-hint">
          Rows with an installation method and no ampacity look it up here, with the ambient and grouping corrections. A row with neither is listed as an error.
        </p>
        {errors.tableId ? (
          <p id={`${ids.table}-error`} className="field-error" role="alert">
            {errors.tableId}
          </p>
        ) : null}
      </div>
      <div className="grid grid-cols-3 gap-3">
        <div className="col-span-2">
          <label htmlFor={ids.limit} className="field-label">
            Voltage-drop limit
          </label>
          <select id={ids.limit} name="limitId" className="field-input" defaultValue={defaultLimitId} aria-invalid={errors.limitId ? true : undefined} aria-describedby={describe("limitId", ids.limit, false)}>
            {limits.map((l) => (
              <option key={l.id} value={l.id}>
                {l.label}
              </option>
            ))}
          </select>
          {errors.limitId ? (
            <p id={`${ids.limit}-error`} className="field-error" role="alert">
              {errors.limitId}
            </p>
          ) : null}
        </div>
        <div>
          <label htmlFor={ids.percent} className="field-label">
            Override (%)
          </label>
          <input
            id={ids.percent}
            name="limitPercent"
            inputMode="decimal"
            className="field-input"
            placeholder="—"
            aria-invalid={errors.limitPercent ? true : undefined}
            aria-describedby={describe("limitPercent", ids.percent)}
          />
          <p id={`${ids.percent}-hint`} className="field-hint">
            Above 0 up to 50; empty uses the limit chosen.
          </p>
          {errors.limitPercent ? (
            <p id={`${ids.percent}-error`} className="field-error" role="alert">
              {errors.limitPercent}
            </p>
          ) : null}
        </div>
      </div>
      <div className="flex flex-wrap items-center gap-3 md:col-span-2">
        <button type="submit" className="btn-primary" disabled={pending} aria-busy={pending}>
          {pending ? "Reading and computing…" : "Upload and compute"}
        </button>
        {message ? (
          <p id="upload-message" role="alert" className="text-sm text-signal-700">
            {message}
          </p>
        ) : null}
        {done ? (
          <p role="status" className="text-sm text-verdigris-700">
            {done}
          </p>
        ) : null}
      </div>
    </form>
  );
}
