"use client";

import { useState } from "react";
import { uploadLogoAction } from "./actions";

/** The logo upload: the server checks the file's content; its message is shown on the field. */
export function LogoForm() {
  const [error, setError] = useState<string | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const [pending, setPending] = useState(false);
  async function submit(form: FormData) {
    setPending(true);
    setError(null);
    setDone(null);
    const r = await uploadLogoAction(form);
    setPending(false);
    if (r.ok) setDone(`Logo saved (${r.data.width} × ${r.data.height} px). New PDFs print it in the title block.`);
    else setError(r.error.fields?.logo ?? r.error.message);
  }
  return (
    <form action={submit} className="space-y-3">
      <div>
        <label htmlFor="logo" className="field-label">
          Logo file
        </label>
        <input
          id="logo"
          name="logo"
          type="file"
          accept="image/png,image/jpeg"
          required
          className="field-input"
          aria-invalid={error ? true : undefined}
          aria-describedby={error ? "logo-error logo-hint" : "logo-hint"}
        />
        <p id="logo-hint" className="field-hint">
          PNG or JPEG, at most 1 MB and 2000 × 2000 px. A wide logo on a white or transparent ground prints best.
        </p>
        {error ? (
          <p id="logo-error" className="field-error" role="alert">
            {error}
          </p>
        ) : null}
      </div>
      <button type="submit" className="btn-primary" disabled={pending}>
        {pending ? "Uploading…" : "Upload logo"}
      </button>
      {done ? (
        <p role="status" className="text-sm text-verdigris-700">
          {done}
        </p>
      ) : null}
    </form>
  );
}
