"use client";

import { useRouter } from "next/navigation";
import { useState, useTransition } from "react";
import { InputField } from "@/components/forms/field";
import { FormAlert } from "@/components/forms/form-alert";
import { SubmitButton } from "@/components/forms/submit-button";
import { defaultInputs, sheetKind, suggestTag, type ProjectBasis } from "@/lib/sheets/kinds";
import { createSheetAction } from "../actions";

/**
 * Kind, tag and title of a new sheet. The tag and title rules are the server's
 * (lib/sheets/schemas): its field messages come back and sit under the fields.
 */
export function NewSheetForm({
  projectId,
  kinds,
  initialKind,
  takenTags,
  basis,
}: {
  projectId: number;
  kinds: readonly string[];
  initialKind: string;
  takenTags: readonly string[];
  basis: ProjectBasis;
}) {
  const router = useRouter();
  const [kind, setKind] = useState(initialKind);
  const [tag, setTag] = useState(() => suggestTag(initialKind, takenTags));
  const [tagEdited, setTagEdited] = useState(false);
  const [title, setTitle] = useState(() => sheetKind(initialKind)?.name ?? "");
  const [titleEdited, setTitleEdited] = useState(false);
  const [errors, setErrors] = useState<{ message: string; fields: Record<string, string> } | null>(null);
  const [pending, start] = useTransition();

  // Messages with no field of their own here (or the whole-form message when none has a field).
  const otherFields = Object.entries(errors?.fields ?? {}).filter(([f]) => f !== "tag" && f !== "title");
  const formMessage = !errors ? null : otherFields.length > 0 ? otherFields.map(([, m]) => m).join("; ") : Object.keys(errors.fields).length === 0 ? errors.message : null;

  function choose(k: string) {
    setKind(k);
    if (!tagEdited) setTag(suggestTag(k, takenTags));
    if (!titleEdited) setTitle(sheetKind(k)?.name ?? "");
  }

  return (
    <form
      noValidate
      className="space-y-6"
      onSubmit={(e) => {
        e.preventDefault();
        start(async () => {
          setErrors(null);
          const res = await createSheetAction({ projectId, kind, tag, title, inputs: defaultInputs(kind, basis) });
          if (!res.ok) {
            setErrors({ message: res.error.message, fields: res.error.fields ?? {} });
            return;
          }
          router.push(`/projects/${res.data.projectId}/sheets/${res.data.sheetId}`);
        });
      }}
    >
      {formMessage ? <FormAlert>{formMessage}</FormAlert> : null}
      <fieldset>
        <legend className="field-label mb-2">What to calculate</legend>
        <div className="grid gap-3 md:grid-cols-2 xl:grid-cols-3">
          {kinds.map((k) => {
            const def = sheetKind(k);
            const checked = k === kind;
            return (
              <label
                key={k}
                className={`flex cursor-pointer gap-3 rounded-lg border p-4 ${checked ? "border-copper-500 bg-copper-50 ring-2 ring-copper-200" : "border-fen-200 bg-white hover:border-fen-300"}`}
              >
                <input type="radio" name="kind" value={k} checked={checked} onChange={() => choose(k)} className="mt-1 h-4 w-4 text-copper-600" />
                <span>
                  <span className="block font-semibold text-fen-900">{def?.name ?? k}</span>
                  <span className="mt-0.5 block text-sm text-fen-600">{def?.summary}</span>
                </span>
              </label>
            );
          })}
        </div>
      </fieldset>
      <div className="grid gap-4 sm:grid-cols-3">
        <InputField
          label="Tag"
          hint="Unique in the project, e.g. BR-01"
          value={tag}
          maxLength={40}
          required
          error={errors?.fields.tag}
          onChange={(e) => {
            setTag(e.target.value);
            setTagEdited(true);
          }}
        />
        <InputField
          label="Title"
          className="sm:col-span-2"
          value={title}
          maxLength={200}
          required
          error={errors?.fields.title}
          onChange={(e) => {
            setTitle(e.target.value);
            setTitleEdited(true);
          }}
        />
      </div>
      <div className="flex gap-3">
        <SubmitButton pending={pending} pendingLabel="Creating…">
          Create sheet
        </SubmitButton>
        <button type="button" className="btn-secondary" onClick={() => router.back()}>
          Cancel
        </button>
      </div>
    </form>
  );
}
