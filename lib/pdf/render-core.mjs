/**
 * Renders a PDF from a plain description tree ({ t, p, c }), so that the same tree can
 * be rendered here or in a worker thread (a tree of plain data crosses the thread
 * boundary; React elements and functions do not). Plain JavaScript on purpose: the
 * worker entry loads it without a TypeScript loader.
 *
 * Node types are react-pdf's primitives by name, plus "PageNo": a Text whose content
 * is `p.template` with {page} and {pages} filled in at layout time, and "Mark": an
 * invisible Text that records the page it lands on under `p.id` (how a package learns
 * where each section starts, for its index), and "PageRef": a Text that prints the page
 * of the Mark `p.id` — react-pdf calls render props again once every page is split, when
 * all marks are known, so an index can print its page numbers in the same pass. What a
 * PageRef printed last is returned under `refs`, for the caller to check against `marks`.
 */
import path from "node:path";
import { createElement } from "react";
import * as RP from "@react-pdf/renderer";

let fontsReady = false;

/** Registers the IBM Plex faces (TTF: react-pdf embeds and subsets them). */
export function registerFonts(root = process.cwd()) {
  if (fontsReady) return;
  const f = (name) => path.join(root, "fonts", name);
  RP.Font.register({
    family: "Plex Sans",
    fonts: [
      { src: f("IBMPlexSans-Regular.ttf"), fontWeight: 400 },
      { src: f("IBMPlexSans-Medium.ttf"), fontWeight: 500 },
      { src: f("IBMPlexSans-SemiBold.ttf"), fontWeight: 600 },
      { src: f("IBMPlexSans-Bold.ttf"), fontWeight: 700 },
    ],
  });
  RP.Font.register({
    family: "Plex Mono",
    fonts: [
      { src: f("IBMPlexMono-Regular.ttf"), fontWeight: 400 },
      { src: f("IBMPlexMono-Bold.ttf"), fontWeight: 700 },
    ],
  });
  // Words are not split with hyphens: tags and codes must stay whole.
  RP.Font.registerHyphenationCallback((word) => [word]);
  fontsReady = true;
}

const PRIMITIVES = {
  Document: RP.Document,
  Page: RP.Page,
  View: RP.View,
  Text: RP.Text,
  Image: RP.Image,
  Link: RP.Link,
  Svg: RP.Svg,
  G: RP.G,
  Path: RP.Path,
  Rect: RP.Rect,
  Line: RP.Line,
  Circle: RP.Circle,
  Polyline: RP.Polyline,
  Polygon: RP.Polygon,
  Tspan: RP.Tspan,
  SvgText: RP.Text,
};

function fill(template, pageNumber, totalPages) {
  return template.replace("{page}", String(pageNumber)).replace("{pages}", String(totalPages));
}

/** The text a PageRef prints for a mark's page (a dash while or when it is unknown). */
export function pageRefText(page) {
  return page === undefined ? "—" : String(page);
}

/** The description tree → React elements of react-pdf; page marks are written into `ctx.marks`, printed page references into `ctx.refs`. */
export function toElement(node, key, ctx = { marks: {}, refs: {} }) {
  const { marks, refs } = ctx;
  if (node === null || node === undefined || node === false) return null;
  if (typeof node === "string" || typeof node === "number") return String(node);
  const props = { ...(node.p ?? {}) };
  if (key !== undefined) props.key = key;
  if (node.t === "PageNo") {
    const { template, ...rest } = props;
    return createElement(RP.Text, { ...rest, render: ({ pageNumber, totalPages }) => fill(template, pageNumber, totalPages) });
  }
  if (node.t === "Mark") {
    const id = props.id;
    return createElement(RP.Text, {
      key,
      style: { fontSize: 1, color: "#ffffff", height: 1 },
      render: ({ pageNumber }) => {
        marks[id] = pageNumber;
        return " ";
      },
    });
  }
  if (node.t === "PageRef") {
    const { id, ...rest } = props;
    return createElement(RP.Text, {
      ...rest,
      render: () => {
        const printed = pageRefText(marks[id]);
        refs[id] = printed;
        return printed;
      },
    });
  }
  if (node.t === "Image" && props.src && typeof props.src === "object" && props.src.base64) {
    props.src = { data: Buffer.from(props.src.base64, "base64"), format: props.src.format };
  }
  const type = PRIMITIVES[node.t];
  if (!type) throw new Error(`Unknown PDF node type ${node.t}`);
  const children = (node.c ?? []).map((c, i) => toElement(c, i, ctx));
  return createElement(type, props, ...children);
}

/** Renders a Document tree to a PDF Buffer. */
export async function renderTree(tree, root) {
  return (await renderTreeWithMarks(tree, root)).pdf;
}

/** Renders a Document tree; also returns the page each Mark landed on and what each PageRef printed. */
export async function renderTreeWithMarks(tree, root) {
  registerFonts(root);
  const ctx = { marks: {}, refs: {} };
  const pdf = await RP.renderToBuffer(toElement(tree, undefined, ctx));
  return { pdf, marks: ctx.marks, refs: ctx.refs };
}
