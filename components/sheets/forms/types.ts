import type { ComponentType } from "react";
import type { z } from "zod";
import type { CalcResult } from "@/lib/engine/core/result";

/** A loss another sheet of the project offers to an enclosure heat budget. */
export interface LossSource {
  sheetId: number;
  tag: string;
  title: string;
  kind: string;
  label: string;
  status: string;
  /** Busbar rating: heat per metre of the governing phase at the operating point, W/m. */
  lossPerMetre_W_m?: number;
  /** Busbar rating: number of phases (the loss counts per phase). */
  phases?: number;
  /** Voltage drop: the feeder's total loss, W, when its result provides one. */
  feederLoss_W?: number;
}

export interface SheetFormProps {
  /** Other sheets' losses (enclosure heat budget only). */
  lossSources?: readonly LossSource[];
}

/** What the editor loads for one kind: its form, the engine schema and (cheap kinds) the calculation. */
export interface KindModule {
  schema: z.ZodType;
  /** Present for kinds run in the page; heavy kinds run in the worker. */
  run?: (input: never) => CalcResult<unknown>;
  Form: ComponentType<SheetFormProps>;
}
