"use client";

import { useEffect } from "react";
import { useFormContext, useWatch } from "react-hook-form";
import { calcFaultWithstand, faultWithstandSchema, INSULATION_LIMITS, SUPPORT_TYPES } from "@/lib/engine/short-circuit";
import { ArrangementFields } from "./arrangement-fields";
import { CheckField, ChoiceField, Group, NumField, opt } from "./kit";
import { MATERIAL_OPTIONS, temperIsValid, temperOptions } from "./options";
import type { KindModule } from "./types";

const INSULATIONS = INSULATION_LIMITS.map((l) => opt(l.id, l.name));
const SUPPORTS = SUPPORT_TYPES.map((s) => opt(s.id, s.name));

/** Fault withstand: the fault, the conductor, its supports. */
function FaultWithstandForm() {
  const { control, setValue } = useFormContext();
  const peakMode = useWatch({ control, name: "peak.mode" });
  const conductorType = useWatch({ control, name: "conductor.type" });
  const materialId = String(useWatch({ control, name: "materialId" }) ?? "");
  const temperId = useWatch({ control, name: "temperId" });
  useEffect(() => {
    if (!temperIsValid(materialId, temperId)) setValue("temperId", "", { shouldValidate: true, shouldDirty: true });
  }, [materialId, temperId, setValue]);

  return (
    <div className="space-y-4">
      <Group title="Fault">
        <NumField path="I_kA" label="Prospective short-circuit current (rms)" unit="kA" />
        <NumField path="t_s" label="Duration" unit="s" />
        <NumField path="frequency_Hz" label="Frequency" unit="Hz" />
        <ChoiceField
          path="peak.mode"
          label="Peak factor"
          options={[opt("table", "From the rms current (assembly standard table)"), opt("rx", "From the R/X ratio"), opt("entered", "Entered")]}
        />
        {peakMode === "rx" ? <NumField path="peak.rOverX" label="R/X ratio" unit="" /> : null}
        {peakMode === "entered" ? <NumField path="peak.n" label="Peak factor n = ip/I" unit="" /> : null}
        <CheckField path="dcComponent" label="Include the heat of the DC component" />
      </Group>
      <Group title="Conductor">
        <ChoiceField path="materialId" label="Material" options={MATERIAL_OPTIONS} />
        <ChoiceField path="temperId" label="Temper" options={temperOptions(materialId)} />
        <ChoiceField path="insulationId" label="Insulation and temperature limits" options={INSULATIONS} />
        <NumField path="thetaInitial_C" label="Temperature when the fault starts" hint="The insulation's continuous limit when empty" />
        <NumField path="thetaFinal_C" label="Final temperature limit" hint="The insulation's short-circuit limit when empty" />
        <ChoiceField path="conductor.type" label="Conductor" options={[opt("bars", "Bar arrangement"), opt("section", "Section only (thermal check)")]} />
        {conductorType === "section" ? <NumField path="conductor.section_mm2" label="Conductor section" /> : null}
      </Group>
      {conductorType === "bars" ? (
        <Group title="Bar arrangement">
          <ArrangementFields prefix="conductor.arrangement" />
        </Group>
      ) : null}
      {conductorType === "bars" ? (
        <Group title="Supports (mechanical check)" description="Give the span for the stresses and support forces; without it only the longest allowed span is given.">
          <NumField path="span_m" label="Support span" />
          <ChoiceField path="supportId" label="Support type" options={SUPPORTS} />
          <NumField path="spacerDistance_m" label="Spacer distance within a pack" hint="The span when empty" />
          <NumField path="supportRating_N" label="Support rated strength" unit="N" />
          <NumField path="vSigmaVr" label="Vσ·Vr" unit="" hint="1 without three-phase auto-reclosure" />
          <NumField path="vFVr" label="VF·Vr" unit="" hint="2.7 is the upper bound for three-phase faults" />
        </Group>
      ) : null}
    </div>
  );
}

export const faultWithstand: KindModule = { schema: faultWithstandSchema, run: calcFaultWithstand as KindModule["run"], Form: FaultWithstandForm };
