"use client";

import { useRouter } from "next/navigation";
import { useId, useState, useTransition } from "react";
import { FormAlert } from "@/components/forms/form-alert";
import type { SizingCandidate } from "@/lib/engine/busbar-sizing";
import { MATERIALS } from "@/lib/engine/materials";
import type { ActionResult } from "@/lib/auth/guard";
import { suggestTag } from "@/lib/sheets/kinds";

type CreateAction = (raw: unknown) => Promise<ActionResult<{ sheetId: number; projectId: number }>>;

/**
 * Turns a passing arrangement of a busbar sizing into a new busbar rating sheet of the
 * same project: the arrangement, material and surroundings carried over, the sizing's
 * current and temperature limit as the operating point.
 */
export function PickArrangement({
  candidate: c,
  sizingInputs,
  projectId,
  sizingTag,
  takenTags,
  create,
  onClose,
}: {
  candidate: SizingCandidate;
  sizingInputs: Record<string, unknown>;
  projectId: number;
  sizingTag: string;
  takenTags: readonly string[];
  create: CreateAction;
  onClose: () => void;
}) {
  const router = useRouter();
  const id = useId();
  const material = MATERIALS.find((m) => m.id === c.materialId);
  const name = `${c.barsPerPhase} × ${c.size}`;
  const [tag, setTag] = useState(() => suggestTag("busbar-rating", takenTags));
  const [title, setTitle] = useState(`Busbar rating, ${name} ${material?.metal ?? ""} (from ${sizingTag})`.replace(/\s+/g, " "));
  const [error, setError] = useState<{ message: string; fields?: Record<string, string> } | null>(null);
  const [pending, start] = useTransition();

  const inputs = {
    arrangement: c.arrangement,
    materialId: c.materialId,
    finish: sizingInputs.finish,
    emissivity: sizingInputs.emissivity,
    ambient_C: sizingInputs.ambient_C,
    altitude_m: sizingInputs.altitude_m,
    frequency_Hz: sizingInputs.frequency_Hz,
    current_A: sizingInputs.current_A,
    maxTemperature_C: sizingInputs.maxTemperature_C,
  };

  return (
    <div className="panel space-y-3 p-4" role="dialog" aria-labelledby={`${id}-h`}>
      <h3 id={`${id}-h`} className="text-sm font-semibold text-fen-900">
        Rate {name} ({material?.name ?? c.materialId}) in a new busbar rating sheet
      </h3>
      {error ? <FormAlert>{error.message}</FormAlert> : null}
      <div className="grid gap-3 sm:grid-cols-3">
        <div>
          <label htmlFor={`${id}-tag`} className="field-label">
            Tag
          </label>
          <input
            id={`${id}-tag`}
            className="field-input"
            value={tag}
            onChange={(e) => setTag(e.target.value)}
            aria-invalid={error?.fields?.tag ? true : undefined}
            aria-describedby={error?.fields?.tag ? `${id}-tag-error` : undefined}
          />
          {error?.fields?.tag ? (
            <p id={`${id}-tag-error`} className="field-error">
              {error.fields.tag}
            </p>
          ) : null}
        </div>
        <div className="sm:col-span-2">
          <label htmlFor={`${id}-title`} className="field-label">
            Title
          </label>
          <input
            id={`${id}-title`}
            className="field-input"
            value={title}
            onChange={(e) => setTitle(e.target.value)}
            aria-invalid={error?.fields?.title ? true : undefined}
            aria-describedby={error?.fields?.title ? `${id}-title-error` : undefined}
          />
          {error?.fields?.title ? (
            <p id={`${id}-title-error`} className="field-error">
              {error.fields.title}
            </p>
          ) : null}
        </div>
      </div>
      <div className="flex gap-2">
        <button
          type="button"
          className="btn-primary"
          disabled={pending}
          onClick={() =>
            start(async () => {
              const res = await create({ projectId, kind: "busbar-rating", tag, title, inputs: JSON.parse(JSON.stringify(inputs)) });
              if (!res.ok) return setError(res.error);
              router.push(`/projects/${res.data.projectId}/sheets/${res.data.sheetId}`);
            })
          }
        >
          Create busbar rating
        </button>
        <button type="button" className="btn-secondary" onClick={onClose} disabled={pending}>
          Cancel
        </button>
      </div>
    </div>
  );
}
