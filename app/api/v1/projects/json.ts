import type { ProjectDetail } from "@/db/queries/projects";
import { notFound } from "@/lib/errors";
import { toProjectFormValues } from "@/lib/validation/project";

/**
 * A project as the JSON API sends it: the fields a client sends back in POST/PATCH
 * (design ambient and altitude in the project's unit system) plus the stored SI values.
 */
export function projectJson(p: ProjectDetail) {
  const form = toProjectFormValues(p);
  return {
    id: p.id,
    version: p.version,
    code: p.code,
    name: p.name,
    client: p.client,
    site: p.site,
    systemVoltage: p.systemVoltage,
    systemType: p.systemType,
    frequency: p.frequency,
    earthing: p.earthing,
    designAmbient: Number(form.designAmbient),
    altitude: Number(form.altitude),
    standardFamily: p.standardFamily,
    unitSystem: p.unitSystem,
    notes: p.notes,
    designAmbientC: p.designAmbientC,
    altitudeM: p.altitudeM,
    archivedAt: p.archivedAt?.toISOString() ?? null,
    createdAt: p.createdAt.toISOString(),
    updatedAt: p.updatedAt.toISOString(),
    createdBy: p.createdByName,
  };
}

/** Route ids are positive integers; anything else is simply not found. */
export function parseProjectId(raw: string | undefined): number {
  const id = /^\d{1,10}$/.test(raw ?? "") ? Number(raw) : NaN;
  if (!Number.isSafeInteger(id) || id < 1 || id > 2 ** 32 - 1) throw notFound("Project not found");
  return id;
}
