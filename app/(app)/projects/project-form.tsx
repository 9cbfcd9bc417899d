"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm, useWatch } from "react-hook-form";
import { useSWRConfig } from "swr";
import type { z } from "zod";
import { EARTHING_ARRANGEMENTS, STANDARD_FAMILIES, SYSTEM_TYPES, UNIT_SYSTEMS } from "@/db/schema/projects";
import type { ActionResult } from "@/lib/auth/guard";
import {
  cToF,
  FREQUENCY_CHOICES,
  FREQUENCY_LABELS,
  fToC,
  ftToM,
  mToFt,
  PROJECT_LIMITS,
  projectSchema,
  STANDARD_FAMILY_LABELS,
  STALE_PROJECT_MESSAGE,
  SYSTEM_TYPE_LABELS,
  tidy,
  UNIT_SYSTEM_LABELS,
} from "@/lib/validation/project";
import { createProjectAction, updateProjectAction } from "./actions";
import { InputField, SelectField, TextAreaField } from "@/components/forms/field";
import { FormAlert } from "@/components/forms/form-alert";
import { applyServerErrors } from "@/components/forms/server-errors";
import { SubmitButton } from "@/components/forms/submit-button";
import { isProjectListKey } from "./list-key";

type FormIn = z.input<typeof projectSchema>;
type FormOut = z.output<typeof projectSchema>;
export type ProjectFormStrings = Record<keyof FormIn, string>;

export const EMPTY_PROJECT: ProjectFormStrings = {
  code: "",
  name: "",
  client: "",
  site: "",
  systemVoltage: "400",
  systemType: "3ph-4w",
  frequency: "50",
  earthing: "TN-S",
  designAmbient: "35",
  altitude: "0",
  standardFamily: "iec",
  unitSystem: "metric",
  notes: "",
};

const FIELD_NAMES = Object.keys(EMPTY_PROJECT) as (keyof FormIn)[];

const options = <T extends string>(values: readonly T[], labels?: Record<T, string>) => values.map((v) => ({ value: v, label: labels?.[v] ?? v }));

type Props = { mode: "create"; initial?: ProjectFormStrings } | { mode: "edit"; id: number; version: number; initial: ProjectFormStrings };

/** Create and edit share one form: the same zod schema as the server action, field errors from either side. */
export function ProjectForm(props: Props) {
  const router = useRouter();
  const { mutate } = useSWRConfig();
  const [formError, setFormError] = useState<string | null>(null);
  const [stale, setStale] = useState(false);
  const {
    register,
    handleSubmit,
    setError,
    setValue,
    getValues,
    control,
    formState: { errors, isSubmitting },
  } = useForm<FormIn, unknown, FormOut>({
    resolver: zodResolver(projectSchema),
    // Stored values and defaults are valid choices; the schema checks them again on submit.
    defaultValues: (props.initial ?? EMPTY_PROJECT) as FormIn,
    mode: "onTouched",
  });

  const unitSystem = useWatch({ control, name: "unitSystem" });
  const systemType = useWatch({ control, name: "systemType" });
  const imperial = unitSystem === "imperial";
  const dc = systemType === "dc";
  const vRange = dc ? PROJECT_LIMITS.voltageDc : PROJECT_LIMITS.voltageAc;
  const tRange = imperial ? PROJECT_LIMITS.ambientF : PROJECT_LIMITS.ambientC;
  const aRange = imperial ? PROJECT_LIMITS.altitudeFt : PROJECT_LIMITS.altitudeM;
  const err = (k: keyof FormIn) => errors[k]?.message as string | undefined;

  /** Keeps the entered temperature and altitude meaning the same when the unit system changes. */
  function convertUnits(to: string) {
    const from = to === "imperial" ? "metric" : "imperial";
    const t = Number(String(getValues("designAmbient")).trim());
    const a = Number(String(getValues("altitude")).trim());
    const opts = { shouldValidate: false } as const;
    if (String(getValues("designAmbient")).trim() !== "" && Number.isFinite(t))
      setValue("designAmbient", String(tidy(from === "metric" ? cToF(t) : fToC(t), 1)), opts);
    if (String(getValues("altitude")).trim() !== "" && Number.isFinite(a))
      setValue("altitude", String(tidy(from === "metric" ? mToFt(a) : ftToM(a), 0)), opts);
  }

  /** DC has no frequency; an AC system needs one. */
  function alignFrequency(type: string) {
    const f = String(getValues("frequency"));
    if (type === "dc" && f !== "0") setValue("frequency", "0");
    if (type !== "dc" && f === "0") setValue("frequency", getValues("standardFamily") === "north-american" ? "60" : "50");
  }

  async function onSubmit(values: FormOut) {
    setFormError(null);
    let result: ActionResult<{ id: number }>;
    try {
      result = props.mode === "create" ? await createProjectAction(values) : await updateProjectAction({ ...values, id: props.id, version: props.version });
    } catch {
      setFormError("Ohmstead could not be reached, so nothing was saved. Check the connection and try again.");
      return;
    }
    if (result.ok) {
      await mutate(isProjectListKey);
      router.push(`/projects/${result.data.id}`);
      router.refresh();
      return;
    }
    const { code, message, fields } = result.error;
    if (code === "conflict" && message === STALE_PROJECT_MESSAGE) {
      setStale(true);
      return;
    }
    setFormError(applyServerErrors(setError, { message, fields }, FIELD_NAMES));
  }

  const field = (name: keyof FormIn, onChange?: (value: string) => void) => ({
    id: `project-${name}`,
    error: err(name),
    ...register(name, onChange ? { onChange: (e: { target: { value: string } }) => onChange(e.target.value) } : undefined),
  });

  return (
    <form onSubmit={handleSubmit(onSubmit)} noValidate className="space-y-6">
      {stale && (
        <div role="alert" className="flex flex-col gap-3 rounded-lg border border-amberline-500 bg-amberline-50 p-4 text-sm text-amberline-700 sm:flex-row sm:items-center sm:justify-between">
          <p>
            <strong className="font-semibold">Your changes were not saved.</strong> {STALE_PROJECT_MESSAGE}.
          </p>
          <button type="button" className="btn-secondary shrink-0" onClick={() => window.location.reload()}>
            Reload
          </button>
        </div>
      )}
      {formError && <FormAlert>{formError}</FormAlert>}

      <fieldset className="panel p-5">
        <legend className="px-1 text-sm font-semibold text-fen-900">Identification</legend>
        <div className="grid gap-4 sm:grid-cols-3">
          <InputField
            label="Project code"
            {...field("code")}
            autoComplete="off"
            spellCheck={false}
            className="sm:col-span-1"
            hint="2–40 characters: letters, digits, - _ /. Unique in your organisation."
          />
          <InputField label="Project name" {...field("name")} className="sm:col-span-2" maxLength={160} />
          <InputField label="Client" {...field("client")} className="sm:col-span-1" maxLength={160} />
          <InputField label="Site" {...field("site")} className="sm:col-span-2" maxLength={160} />
        </div>
      </fieldset>

      <fieldset className="panel p-5">
        <legend className="px-1 text-sm font-semibold text-fen-900">Supply system</legend>
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          <InputField
            label="System voltage"
            {...field("systemVoltage")}
            inputMode="decimal"
            hint={`In volts: ${vRange.min}–${vRange.max} V ${dc ? "DC" : "AC, line to line"}`}
          />
          <SelectField
            label="System type"
            {...field("systemType", alignFrequency)}
            options={options(SYSTEM_TYPES, SYSTEM_TYPE_LABELS)}
          />
          <SelectField label="Frequency" {...field("frequency")} options={options(FREQUENCY_CHOICES, FREQUENCY_LABELS)} hint="DC systems use DC (0 Hz)" />
          <SelectField label="Earthing arrangement" {...field("earthing")} options={options(EARTHING_ARRANGEMENTS)} />
        </div>
      </fieldset>

      <fieldset className="panel p-5">
        <legend className="px-1 text-sm font-semibold text-fen-900">Design basis</legend>
        <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
          <SelectField label="Standard family" {...field("standardFamily")} options={options(STANDARD_FAMILIES, STANDARD_FAMILY_LABELS)} />
          <SelectField
            label="Unit system"
            {...field("unitSystem", convertUnits)}
            options={options(UNIT_SYSTEMS, UNIT_SYSTEM_LABELS)}
            hint="Changing it converts the temperature and altitude"
          />
          <InputField
            label="Design ambient temperature"
            {...field("designAmbient")}
            inputMode="decimal"
            hint={`In ${imperial ? "°F" : "°C"}: ${tRange.min} to +${tRange.max} ${imperial ? "°F" : "°C"}, the air around the enclosure`}
          />
          <InputField label="Altitude" {...field("altitude")} inputMode="decimal" hint={`In ${imperial ? "feet" : "metres"} above sea level: 0–${aRange.max} ${imperial ? "ft" : "m"}`} />
        </div>
      </fieldset>

      <fieldset className="panel p-5">
        <legend className="px-1 text-sm font-semibold text-fen-900">Notes</legend>
        <TextAreaField label="Notes" {...field("notes")} rows={5} maxLength={PROJECT_LIMITS.notes} hint={`Up to ${PROJECT_LIMITS.notes} characters`} />
      </fieldset>

      <div className="flex items-center justify-end gap-2">
        <Link href={props.mode === "edit" ? `/projects/${props.id}` : "/projects"} className="btn-secondary">
          Cancel
        </Link>
        <SubmitButton pending={isSubmitting} pendingLabel="Saving…" disabled={stale}>
          {props.mode === "create" ? "Create project" : "Save changes"}
        </SubmitButton>
      </div>
    </form>
  );
}
