import type { SheetStatus } from "@/db/schema";
import type { UnitSystem } from "@/db/schema/projects";
import type { CalcResult } from "@/lib/engine/core/result";

/** An image embedded in a PDF (the organisation's logo), as base64 so it crosses to a worker. */
export interface PdfImage {
  base64: string;
  format: "png" | "jpg";
}

export interface PdfOrganisation {
  name: string;
  logo: PdfImage | null;
}

export interface PdfProject {
  code: string;
  name: string;
  client: string;
  site: string;
  unitSystem: UnitSystem;
}

/** Everything one sheet's pages need; plain data (no database access while rendering). */
export interface SheetPdfData {
  organisation: PdfOrganisation;
  project: PdfProject;
  sheet: { id: number; tag: string; title: string; kind: string; kindTitle: string };
  revision: {
    ordinal: number;
    label: string;
    status: SheetStatus;
    authorName: string;
    checkedByName: string | null;
    createdAt: Date;
    submittedAt: Date | null;
    decidedAt: Date | null;
    engineVersion: string;
    contentHash: string;
    inputs: Record<string, unknown>;
    results: CalcResult<unknown> | null;
  };
  /** Present when the revision was approved: the stamp's code and the address it verifies at. */
  verification: { code: string; url: string } | null;
}
