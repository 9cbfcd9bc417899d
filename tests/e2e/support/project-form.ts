// The project form, found by its field labels (lib/validation/project.ts names them).
import type { Page } from "playwright-core";

export interface ProjectFormInput {
  code?: string;
  name?: string;
  client?: string;
  systemVoltage?: string;
  designAmbient?: string;
  altitude?: string;
}

export const projectField = {
  code: (p: Page) => p.getByLabel(/^project code/i),
  name: (p: Page) => p.getByLabel(/^project name/i),
  client: (p: Page) => p.getByLabel(/^client/i),
  systemVoltage: (p: Page) => p.getByLabel(/^system voltage/i),
  designAmbient: (p: Page) => p.getByLabel(/^design ambient/i),
  altitude: (p: Page) => p.getByLabel(/^altitude/i),
};

/** Fills the given fields; numbers left out keep the form's value, or get a sensible one when empty. */
export async function fillProjectForm(page: Page, input: ProjectFormInput) {
  const values: Required<ProjectFormInput> = {
    code: input.code ?? "",
    name: input.name ?? "",
    client: input.client ?? "",
    systemVoltage: input.systemVoltage ?? "400",
    designAmbient: input.designAmbient ?? "35",
    altitude: input.altitude ?? "0",
  };
  for (const key of Object.keys(projectField) as (keyof ProjectFormInput)[]) {
    const field = projectField[key](page);
    if (input[key] !== undefined || (await field.inputValue()) === "") await field.fill(values[key]);
  }
}
