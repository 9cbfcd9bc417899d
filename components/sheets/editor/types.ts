import type { ReactNode } from "react";
import type { SheetStatus } from "@/db/schema/sheets";
import type { Role } from "@/db/schema";
import type { CalcResult } from "@/lib/engine/core/result";
import type { UnitSystem } from "@/lib/sheets/units";
import type { LossSource } from "@/components/sheets/forms/types";

/** The sheet as the editor gets it from its page (plain, serialisable values). */
export interface EditorSheet {
  id: number;
  projectId: number;
  kind: string;
  tag: string;
  title: string;
  /** Optimistic-lock version the page was rendered with. */
  version: number;
}

export interface EditorRevision {
  ordinal: number;
  label: string;
  status: SheetStatus;
  authorId: number;
  authorName: string;
  checkedByName: string | null;
  reviewComment: string | null;
  /** The latest revision (only it can change); older ones are shown read-only. */
  isLatest: boolean;
}

export interface EditorViewer {
  id: number;
  role: Role;
  canWrite: boolean;
  canSubmit: boolean;
  canReview: boolean;
}

export interface SheetEditorProps {
  sheet: EditorSheet;
  revision: EditorRevision;
  /** Inputs of the revision shown, SI, as stored. */
  inputs: Record<string, unknown>;
  /** The result the server computed and stored on save (authoritative), or null for an invalid draft. */
  savedResult: CalcResult<unknown> | null;
  unitSystem: UnitSystem;
  viewer: EditorViewer;
  /** Label the next revision will get ("B"). */
  nextLabel: string;
  projectArchived: boolean;
  /** Tags already used in the project (for a sheet created from a sizing pick). */
  takenTags: readonly string[];
  lossSources: readonly LossSource[];
  /**
   * Shown instead of the form and the live results (a bus network too large for the
   * form: its stored server result); the workflow bar stays. `inputs` may then be empty.
   */
  summary?: ReactNode;
}
