"use client";

import { useEffect } from "react";
import { useFormContext, useWatch } from "react-hook-form";
import { busbarRatingSchema } from "@/lib/engine/busbar-thermal";
import { ArrangementFields } from "./arrangement-fields";
import { ChoiceField, Group, NumField } from "./kit";
import { FINISH_OPTIONS, MATERIAL_OPTIONS, temperIsValid, temperOptions } from "./options";
import type { KindModule } from "./types";

/** Busbar rating: a bar arrangement, its material and surroundings, a current and/or a temperature limit. */
function BusbarRatingForm() {
  const { control, setValue } = useFormContext();
  const materialId = String(useWatch({ control, name: "materialId" }) ?? "");
  const temperId = useWatch({ control, name: "temperId" });
  useEffect(() => {
    if (!temperIsValid(materialId, temperId)) setValue("temperId", "", { shouldValidate: true, shouldDirty: true });
  }, [materialId, temperId, setValue]);

  return (
    <div className="space-y-4">
      <Group title="Bar arrangement">
        <ArrangementFields prefix="arrangement" />
      </Group>
      <Group title="Material and surface">
        <ChoiceField path="materialId" label="Material" options={MATERIAL_OPTIONS} />
        <ChoiceField path="temperId" label="Temper" options={temperOptions(materialId)} />
        <ChoiceField path="finish" label="Surface finish" options={FINISH_OPTIONS} />
        <NumField path="emissivity" label="Emissivity" hint="Leave empty to use the value of the surface finish" />
      </Group>
      <Group title="Surroundings">
        <NumField path="ambient_C" label="Ambient or enclosure air temperature" hint="Air around the bars: inside the enclosure if they are enclosed" />
        <NumField path="altitude_m" label="Altitude" />
        <NumField path="frequency_Hz" label="Frequency" unit="Hz" hint="0 for DC" />
      </Group>
      <Group title="Operating point and limit" description="Give the current, the temperature limit, or both (both gives the pass/fail checks).">
        <NumField path="current_A" label="Current" />
        <NumField path="maxTemperature_C" label="Temperature limit of the bars" />
      </Group>
    </div>
  );
}

export const busbarRating: KindModule = { schema: busbarRatingSchema, Form: BusbarRatingForm };
