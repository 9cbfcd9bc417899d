import { h, type PdfNode } from "./tree";

/**
 * A formula as readable mathematical notation: "R_ac" prints R with a subscript "ac",
 * "Ra_L^(1/6)" a subscript L and a superscript 1/6. The engine writes its formulas in
 * this plain form (with Unicode symbols); the PDF sets the indices smaller and shifted.
 */
type Piece = { kind: "base" | "sub" | "sup"; text: string };

const RUN = /^[\p{L}\p{N}*'′¼½¾]+/u;

/** Splits an expression into base text, subscripts and superscripts. */
export function mathPieces(expr: string): Piece[] {
  const out: Piece[] = [];
  let base = "";
  let i = 0;
  const flush = () => {
    if (base) out.push({ kind: "base", text: base });
    base = "";
  };
  while (i < expr.length) {
    const ch = expr[i]!;
    if ((ch === "_" || ch === "^") && i + 1 < expr.length) {
      const rest = expr.slice(i + 1);
      let body: string | undefined;
      let used = 0;
      if (rest[0] === "(" || rest[0] === "{") {
        const close = rest[0] === "(" ? ")" : "}";
        let depth = 0;
        for (let j = 0; j < rest.length; j++) {
          if (rest[j] === rest[0]) depth++;
          else if (rest[j] === close && --depth === 0) {
            body = rest.slice(1, j);
            used = j + 1;
            break;
          }
        }
      } else {
        const m = RUN.exec(rest);
        if (m) {
          body = m[0];
          used = body.length;
        }
      }
      if (body) {
        flush();
        out.push({ kind: ch === "_" ? "sub" : "sup", text: body });
        i += 1 + used;
        continue;
      }
    }
    base += ch;
    i++;
  }
  flush();
  return out;
}

const SUPERS: Record<string, string> = { "⁰": "0", "¹": "1", "²": "2", "³": "3", "⁴": "4", "⁵": "5", "⁶": "6", "⁷": "7", "⁸": "8", "⁹": "9", "⁻": "−", "⁺": "+", ᵀ: "T", ᵇ: "b", ⁿ: "n" };
const SUBS: Record<string, string> = { "₀": "0", "₁": "1", "₂": "2", "₃": "3", "₄": "4", "₅": "5", "₆": "6", "₇": "7", "₈": "8", "₉": "9", "₊": "+", "₋": "−", ₙ: "n" };
/** Symbols the embedded face lacks, written with ones it has. */
const SUBSTITUTES: Record<string, string> = { "∝": "~", "⇒": "→", "‖": "||" };
const SCRIPT_RUN = new RegExp(`([${Object.keys(SUPERS).join("")}]+)|([${Object.keys(SUBS).join("")}]+)`, "gu");

/** Unicode super- and subscript characters (10⁻⁸, x₁) as index pieces; missing symbols replaced. */
export function scriptPieces(text: string): Piece[] {
  const out: Piece[] = [];
  const clean = [...text].map((c) => (c === "∠" ? "angle " : (SUBSTITUTES[c] ?? c))).join("");
  let last = 0;
  for (const m of clean.matchAll(SCRIPT_RUN)) {
    if (m.index > last) out.push({ kind: "base", text: clean.slice(last, m.index) });
    if (m[1]) out.push({ kind: "sup", text: [...m[1]].map((c) => SUPERS[c] ?? c).join("") });
    else if (m[2]) out.push({ kind: "sub", text: [...m[2]].map((c) => SUBS[c] ?? c).join("") });
    last = m.index + m[0].length;
  }
  if (last < clean.length) out.push({ kind: "base", text: clean.slice(last) });
  return out;
}

/** The expression as a Text node with smaller, shifted indices; `indices: false` for prose (only Unicode scripts are set). */
export function mathText(expr: string, style: Record<string, unknown> = {}, opts: { indices?: boolean } = {}): PdfNode {
  const size = typeof style.fontSize === "number" ? style.fontSize : 9.5;
  const pieces = (opts.indices === false ? [{ kind: "base" as const, text: expr }] : mathPieces(expr)).flatMap((p) =>
    p.kind === "base" ? scriptPieces(p.text) : [{ kind: p.kind, text: scriptPieces(p.text).map((q) => q.text).join("") }],
  );
  return h(
    "Text",
    { style: { fontSize: size, ...style } },
    pieces.map((p) =>
      p.kind === "base" ? p.text : h("Text", { style: { fontSize: size * 0.68, verticalAlign: p.kind === "sub" ? "sub" : "super" } }, p.text),
    ),
  );
}
