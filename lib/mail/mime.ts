/**
 * A small MIME reader for the messages our own sender produces (nodemailer: single-part
 * text, or multipart/alternative and multipart/mixed, bodies in 7bit, 8bit,
 * quoted-printable or base64; headers with RFC 2047 encoded words). It is used by the
 * local fake SMTP server only, so it favours readability over covering all of RFC 2045.
 */

export interface ParsedMail {
  headers: Record<string, string>;
  subject: string;
  from: string;
  to: string;
  date: string | null;
  text: string;
  html: string | null;
}

interface Part {
  headers: Record<string, string>;
  body: string;
}

function splitHeadBody(raw: string): Part {
  const at = raw.indexOf("\n\n");
  const head = at === -1 ? raw : raw.slice(0, at);
  const body = at === -1 ? "" : raw.slice(at + 2);
  return { headers: parseHeaders(head), body };
}

/** Unfolds continuation lines (RFC 5322 §2.2.3) and keeps the first value of each header. */
export function parseHeaders(head: string): Record<string, string> {
  const out: Record<string, string> = {};
  const unfolded = head.replace(/\n[ \t]+/g, " ");
  for (const line of unfolded.split("\n")) {
    const colon = line.indexOf(":");
    if (colon <= 0) continue;
    const name = line.slice(0, colon).trim().toLowerCase();
    if (!(name in out)) out[name] = line.slice(colon + 1).trim();
  }
  return out;
}

function bufferEncoding(charset: string | undefined): BufferEncoding {
  const c = (charset ?? "utf-8").toLowerCase();
  if (c === "iso-8859-1" || c === "latin1" || c === "windows-1252") return "latin1";
  if (c === "us-ascii" || c === "ascii") return "ascii";
  return "utf8";
}

/** Quoted-printable (RFC 2045 §6.7) to bytes. */
export function decodeQuotedPrintable(s: string): Buffer {
  const noSoftBreaks = s.replace(/=[ \t]*\n/g, "");
  const bytes: number[] = [];
  for (let i = 0; i < noSoftBreaks.length; i++) {
    const ch = noSoftBreaks[i]!;
    const hex = noSoftBreaks.slice(i + 1, i + 3);
    if (ch === "=" && /^[0-9A-Fa-f]{2}$/.test(hex)) {
      bytes.push(parseInt(hex, 16));
      i += 2;
    } else {
      for (const b of Buffer.from(ch, "utf8")) bytes.push(b);
    }
  }
  return Buffer.from(bytes);
}

/** RFC 2047 encoded words (`=?utf-8?Q?…?=`, `=?utf-8?B?…?=`); whitespace between adjacent words is dropped. */
export function decodeEncodedWords(value: string): string {
  const word = /=\?([^?]+)\?([QqBb])\?([^?]*)\?=/g;
  const joined = value.replace(/(\?=)\s+(=\?)/g, "$1$2");
  return joined.replace(word, (_m, charset: string, enc: string, data: string) => {
    const bytes = enc.toUpperCase() === "B" ? Buffer.from(data, "base64") : decodeQuotedPrintable(data.replace(/_/g, " "));
    return bytes.toString(bufferEncoding(charset));
  });
}

export function parseContentType(value: string | undefined): { type: string; params: Record<string, string> } {
  const [typePart, ...rest] = (value ?? "text/plain").split(";");
  const params: Record<string, string> = {};
  for (const p of rest) {
    const m = /^\s*([A-Za-z0-9_*-]+)\s*=\s*(?:"([^"]*)"|([^\s;]*))/.exec(p);
    if (m) params[m[1]!.toLowerCase()] = m[2] ?? m[3] ?? "";
  }
  return { type: (typePart ?? "text/plain").trim().toLowerCase(), params };
}

function decodeBody(part: Part): string {
  const cte = (part.headers["content-transfer-encoding"] ?? "7bit").toLowerCase();
  const { params } = parseContentType(part.headers["content-type"]);
  const enc = bufferEncoding(params.charset);
  if (cte === "base64") return Buffer.from(part.body.replace(/\s+/g, ""), "base64").toString(enc);
  if (cte === "quoted-printable") return decodeQuotedPrintable(part.body).toString(enc);
  return part.body;
}

function splitMultipart(body: string, boundary: string): string[] {
  const delimiter = `--${boundary}`;
  const parts: string[] = [];
  let current: string[] | null = null;
  for (const line of body.split("\n")) {
    if (line === `${delimiter}--` || line.trimEnd() === `${delimiter}--`) {
      if (current) parts.push(current.join("\n"));
      return parts;
    }
    if (line.trimEnd() === delimiter) {
      if (current) parts.push(current.join("\n"));
      current = [];
      continue;
    }
    current?.push(line);
  }
  if (current) parts.push(current.join("\n"));
  return parts;
}

function collect(part: Part, found: { text: string | null; html: string | null }, depth: number) {
  if (depth > 5) return;
  const { type, params } = parseContentType(part.headers["content-type"]);
  if (type.startsWith("multipart/") && params.boundary) {
    for (const sub of splitMultipart(part.body, params.boundary)) collect(splitHeadBody(sub), found, depth + 1);
    return;
  }
  if (/^\s*attachment/i.test(part.headers["content-disposition"] ?? "")) return;
  if (type === "text/plain" && found.text === null) found.text = decodeBody(part);
  else if (type === "text/html" && found.html === null) found.html = decodeBody(part);
}

/** Parses a raw RFC 5322 message (CRLF or LF line ends). */
export function parseMail(raw: string): ParsedMail {
  const top = splitHeadBody(raw.replace(/\r\n/g, "\n"));
  const found: { text: string | null; html: string | null } = { text: null, html: null };
  collect(top, found, 0);
  const h = top.headers;
  return {
    headers: h,
    subject: decodeEncodedWords(h.subject ?? ""),
    from: decodeEncodedWords(h.from ?? ""),
    to: decodeEncodedWords(h.to ?? ""),
    date: h.date ?? null,
    text: (found.text ?? "").replace(/\n+$/, "\n"),
    html: found.html,
  };
}
