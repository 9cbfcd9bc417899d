/**
 * The PDF description tree: react-pdf primitives as plain data, so a document can be
 * rendered in this thread or handed to a worker thread (render-core.mjs turns it into
 * react-pdf's element instances). Styles are react-pdf style objects.
 */
export type PdfNodeType =
  | "Document"
  | "Page"
  | "View"
  | "Text"
  | "Image"
  | "Link"
  | "Svg"
  | "G"
  | "Path"
  | "Rect"
  | "Line"
  | "Circle"
  | "Polyline"
  | "Polygon"
  | "Tspan"
  | "SvgText"
  | "PageNo"
  | "Mark"
  | "PageRef";

export type PdfChild = PdfNode | string | number | null | undefined | false;

export interface PdfNode {
  t: PdfNodeType;
  p?: Record<string, unknown>;
  c?: PdfChild[];
}

/** Builds a node; children may be nested arrays (flattened) or empty values (dropped by the renderer). */
export function h(t: PdfNodeType, p: Record<string, unknown> | null, ...c: (PdfChild | PdfChild[])[]): PdfNode {
  const flat: PdfChild[] = [];
  for (const x of c) {
    if (Array.isArray(x)) flat.push(...x);
    else flat.push(x);
  }
  return p ? { t, p, c: flat } : { t, c: flat };
}

/** Text with a style (the common case). */
export const text = (style: Record<string, unknown>, ...c: (PdfChild | PdfChild[])[]) => h("Text", { style }, ...c);
export const view = (style: Record<string, unknown>, ...c: (PdfChild | PdfChild[])[]) => h("View", { style }, ...c);
