import type { PdfNode } from "./tree";

export function registerFonts(root?: string): void;
export function renderTree(tree: PdfNode, root?: string): Promise<Buffer>;
export function pageRefText(page: number | undefined): string;
export function renderTreeWithMarks(tree: PdfNode, root?: string): Promise<{ pdf: Buffer; marks: Record<string, number>; refs: Record<string, string> }>;
