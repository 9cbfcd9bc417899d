import type { PdfNode } from "./tree";

/** A react-pdf element instance, as its layout step takes it. */
export interface PdfInstance {
  type: string;
  box?: Record<string, unknown>;
  style?: Record<string, unknown>;
  props?: Record<string, unknown>;
  children?: PdfInstance[];
  value?: string;
}

export function registerFonts(root?: string): void;
export function loadFonts(root?: string): Promise<void>;
export function toInstance(node: PdfNode | string | number | null | undefined | false, ctx?: { late: number }): PdfInstance[];
export function renderTree(tree: PdfNode, root?: string): Promise<Buffer>;
export function pageRefText(page: number | undefined): string;
export function renderTreeWithMarks(tree: PdfNode, root?: string): Promise<{ pdf: Buffer; marks: Record<string, number>; refs: Record<string, string> }>;
