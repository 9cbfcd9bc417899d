/**
 * Renders a PDF from a plain description tree ({ t, p, c }), so that the same tree can
 * be rendered here or in a worker thread (a tree of plain data crosses the thread
 * boundary; React elements and functions do not). Plain JavaScript on purpose: the
 * worker entry loads it without a TypeScript loader.
 *
 * Node types are react-pdf's primitives by name, plus three that print where things
 * landed: "PageNo", a Text whose content is `p.template` with {page} and {pages} filled
 * in; "Mark", an invisible Text that records the page it lands on under `p.id` (how a
 * package learns where each section starts, for its index); and "PageRef", a Text that
 * prints the page of the Mark `p.id` (what it printed is returned under `refs`).
 *
 * How: the tree becomes react-pdf's element instances directly (no React round trip),
 * react-pdf lays the document out once with placeholders in those texts, the laid-out
 * pages tell how many pages there are and where each Mark landed, and only then are the
 * page numbers set: each such text is laid out on its own (with its page's styles and
 * its ancestors' inherited styles) and put in place of its placeholder. react-pdf's own
 * page-number mechanism (a `render` prop) lays the rest of the document out again on
 * every page break and once more per page at the end; a sheet renders in about three
 * quarters of the time without it, and a package's index is right in one pass.
 * A PageNo or PageRef is therefore positioned absolutely (it takes no room in the flow,
 * so its text cannot move anything; react-pdf itself drops a numbered text that flows
 * under an inherited line height).
 */
import path from "node:path";
import * as RP from "@react-pdf/renderer";

let pdfLibraries = null;

/**
 * react-pdf's layout and drawing steps and its PDF writer (the renderer's own
 * dependencies). Loaded by Node at run time, like the renderer itself, which the
 * framework leaves unbundled: a bundled second copy of the writer would miss its data files.
 */
function libraries() {
  pdfLibraries ??= Promise.all([
    import(/* webpackIgnore: true */ "@react-pdf/layout"),
    import(/* webpackIgnore: true */ "@react-pdf/render"),
    import(/* webpackIgnore: true */ "pdfkit"),
  ]).then(([layout, render, pdfkit]) => ({ layoutDocument: layout.default, renderPdf: render.default, PDFDocument: pdfkit.default }));
  return pdfLibraries;
}

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

let fontsLoaded = null;

/**
 * Reads and parses every registered face once (react-pdf would do it on first use, in
 * the middle of a layout) and gives each a shaping cache: the glyphs and positions of a
 * run of text depend only on the text and the face, and a sheet's labels, headings and
 * units repeat from page to page and sheet to sheet. The cached runs are never changed
 * by react-pdf (it copies positions before scaling and glyph lists before drawing).
 */
export function loadFonts(root) {
  registerFonts(root);
  fontsLoaded ??= Promise.all(
    Object.values(RP.Font.getRegisteredFonts()).flatMap((family) =>
      family.sources.map(async (source) => {
        await source.load();
        if (source.data) cacheShaping(source.data);
      }),
    ),
  ).then(
    () => undefined,
    (err) => {
      fontsLoaded = null;
      throw err;
    },
  );
  return fontsLoaded;
}

/**
 * Shaped runs kept per face, the least recently used going first: a sheet shapes a few
 * hundred, mostly the same labels every time; a run of 30 characters takes about 2.6 kB,
 * so the cache stays under about 8 MB a face.
 */
const SHAPED_RUNS_PER_FACE = 3_000;

function cacheShaping(face) {
  if (face.ohmsteadShapingCache) return;
  const shape = face.layout.bind(face);
  const runs = new Map();
  face.ohmsteadShapingCache = runs;
  face.layout = (string, features, script, language, direction) => {
    if (typeof string !== "string" || typeof features === "string") return shape(string, features, script, language, direction);
    const key = `${direction ?? ""}\u0000${script ?? ""}\u0000${language ?? ""}\u0000${features === undefined ? "" : JSON.stringify(features)}\u0000${string}`;
    let run = runs.get(key);
    if (run === undefined) {
      run = shape(string, features, script, language, direction);
      if (runs.size >= SHAPED_RUNS_PER_FACE) runs.delete(runs.keys().next().value);
    } else runs.delete(key);
    runs.set(key, run);
    return run;
  };
}

/** react-pdf's instance type of each primitive (SvgText is react-pdf's Text inside an Svg). */
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

/** Instance types that hold text directly (react-pdf drops a string anywhere else). */
const TEXT_PARENTS = new Set(["TEXT", "LINK", "TSPAN", "NOTE"]);

function fill(template, pageNumber, totalPages) {
  return template.replace("{page}", String(pageNumber)).replace("{pages}", String(totalPages));
}

/** The text a PageRef prints for a mark's page (a dash when it is unknown). */
export function pageRefText(page) {
  return page === undefined ? "—" : String(page);
}

const textInstance = (value) => ({ type: "TEXT_INSTANCE", value });
const instance = (type, props, style, children) => ({ type, box: {}, style: style ?? {}, props, children });
const isAbsolute = (style) => style?.position === "absolute";

/**
 * The description tree → react-pdf's element instances (what its reconciler would build
 * from the same elements: strings become text instances inside texts, empty values and
 * empty strings are dropped). `ctx.late` counts the texts set after the layout.
 */
export function toInstance(node, ctx = { late: 0 }) {
  if (node === null || node === undefined || node === false || node === true || node === "") return [];
  if (typeof node === "string" || typeof node === "number") return [textInstance(String(node))];
  if (Array.isArray(node)) return node.flatMap((c) => toInstance(c, ctx));
  const { style, ...props } = node.p ?? {};
  if (node.t === "Mark") {
    return [instance("TEXT", { late: { kind: "Mark", id: props.id } }, { fontSize: 1, color: "#ffffff", height: 1 }, [textInstance(" ")])];
  }
  if (node.t === "PageNo" || node.t === "PageRef") {
    const { template, id, ...rest } = props;
    if (!isAbsolute(style)) throw new Error(`A ${node.t} must be positioned absolutely: its text is set after the layout and must not move anything.`);
    const late = node.t === "PageNo" ? { kind: "PageNo", key: ++ctx.late, template } : { kind: "PageRef", key: ++ctx.late, id };
    return [instance("TEXT", { ...rest, late }, style, [textInstance(" ")])];
  }
  const type = PRIMITIVES[node.t];
  if (!type) throw new Error(`Unknown PDF node type ${node.t}`);
  if (node.t === "Image" && props.src && typeof props.src === "object" && props.src.base64) {
    props.src = { data: Buffer.from(props.src.base64, "base64"), format: props.src.format };
  }
  const children = (node.c ?? []).flatMap((c) => toInstance(c, ctx)).filter((c) => c.type !== "TEXT_INSTANCE" || TEXT_PARENTS.has(type));
  return [instance(type, props, style, children)];
}

/** Visits every node below `node` with its ancestors (outermost first). */
function walk(node, ancestors, visit) {
  visit(node, ancestors);
  if (!node.children) return;
  const below = [...ancestors, node];
  for (const c of node.children) if (c && typeof c === "object") walk(c, below, visit);
}

/** `node` with each node that `replace` answers for swapped (unchanged branches are shared). */
function swap(node, replace) {
  const r = replace(node);
  if (r) return r;
  if (!node.children) return node;
  let changed = false;
  const children = node.children.map((c) => {
    const n = c && typeof c === "object" ? swap(c, replace) : c;
    if (n !== c) changed = true;
    return n;
  });
  return changed ? { ...node, children } : node;
}

/**
 * Sets the late texts of a laid-out document: page numbers, and page references from
 * where the marks landed. Each text is laid out in a copy of its source page that keeps
 * only its chain of ancestors (so it inherits exactly what it did in place) and replaces
 * its placeholder on that page.
 */
async function setLateTexts(doc, laid, layoutDocument) {
  const pages = laid.children ?? [];
  const marks = {};
  const refs = {};
  const wanted = []; // { page, late, text }
  pages.forEach((page, i) =>
    walk(page, [], (n) => {
      const late = n.props?.late;
      if (!late) return;
      if (late.kind === "Mark") marks[late.id] ??= i + 1;
      else wanted.push({ page: i, late });
    }),
  );
  if (wanted.length === 0) return { layout: laid, marks, refs };
  for (const w of wanted) {
    w.text = w.late.kind === "PageNo" ? fill(w.late.template, w.page + 1, pages.length) : pageRefText(marks[w.late.id]);
    if (w.late.kind === "PageRef") refs[w.late.id] = w.text;
  }

  const sources = new Map(); // late key → { page, chain, node } in the instance tree
  for (const page of doc.children ?? []) walk(page, [], (n, chain) => n.props?.late?.key && sources.set(n.props.late.key, { page, chain, node: n }));
  const helperPages = new Map(); // source page → its pruned copy
  // Beside each text, a copy with the placeholder: how far the text's box moves from the
  // placeholder's (anchored right or centred, a wider text starts further left) is what
  // moves it on the page.
  wanted.forEach((w, slot) => {
    const src = sources.get(w.late.key);
    if (!helperPages.has(src.page)) helperPages.set(src.page, { ...src.page, props: { ...src.page.props, wrap: false }, children: [] });
    let parent = helperPages.get(src.page);
    for (const a of src.chain.slice(1)) {
      const copy = { ...a, children: [] };
      parent.children.push(copy);
      parent = copy;
    }
    const props = { ...src.node.props, late: undefined };
    parent.children.push({ ...src.node, props: { ...props, slot: 2 * slot }, children: src.node.children }, { ...src.node, props: { ...props, slot: 2 * slot + 1 }, children: [textInstance(w.text)] });
  });
  const helper = await layoutDocument({ ...doc, children: [...helperPages.values()] }, RP.Font);
  const bySlot = [];
  for (const page of helper.children ?? []) walk(page, [], (n) => n.props?.slot !== undefined && (bySlot[n.props.slot] = n));

  const perPage = new Map(); // physical page → (late key → [placeholder, text] laid out)
  wanted.forEach((w, slot) => {
    if (!perPage.has(w.page)) perPage.set(w.page, new Map());
    perPage.get(w.page).set(w.late.key, [bySlot[2 * slot], bySlot[2 * slot + 1]]);
  });
  const children = pages.map((page, i) => {
    const texts = perPage.get(i);
    if (!texts) return page;
    return swap(page, (n) => {
      const pair = n.props?.late && texts.get(n.props.late.key);
      if (!pair) return null;
      const [placeholder, t] = pair;
      const box = { ...n.box, left: n.box.left + t.box.left - placeholder.box.left, top: n.box.top + t.box.top - placeholder.box.top, width: t.box.width, height: t.box.height };
      return { ...n, box, lines: t.lines, alignOffset: t.alignOffset, children: t.children };
    });
  });
  return { layout: { ...laid, children }, marks, refs };
}

/** The PDF writer with the document's metadata, as react-pdf sets it up. */
function pdfWriter(PDFDocument, props) {
  const info = { Title: props.title, Author: props.author, Subject: props.subject, Keywords: props.keywords, Creator: props.creator ?? "react-pdf", Producer: props.producer ?? "react-pdf", CreationDate: new Date() };
  return new PDFDocument({
    compress: true,
    displayTitle: true,
    autoFirstPage: false,
    lang: props.language,
    info: Object.fromEntries(Object.entries(info).filter(([, v]) => v !== undefined)),
  });
}

function collect(stream) {
  return new Promise((resolve, reject) => {
    const chunks = [];
    stream.on("data", (c) => chunks.push(c));
    stream.on("end", () => resolve(Buffer.concat(chunks)));
    stream.on("error", reject);
  });
}

/** Renders a Document tree to a PDF Buffer. */
export async function renderTree(tree, root) {
  return (await renderTreeWithMarks(tree, root)).pdf;
}

/** Renders a Document tree; also returns the page each Mark landed on and what each PageRef printed. */
export async function renderTreeWithMarks(tree, root) {
  const [{ layoutDocument, renderPdf, PDFDocument }] = await Promise.all([libraries(), loadFonts(root)]);
  const [doc] = toInstance(tree);
  if (!doc || doc.type !== RP.Document) throw new Error("A PDF tree starts with a Document");
  const { layout, marks, refs } = await setLateTexts(doc, await layoutDocument(doc, RP.Font), layoutDocument);
  const pdf = await collect(renderPdf(pdfWriter(PDFDocument, doc.props), layout));
  return { pdf, marks, refs };
}
