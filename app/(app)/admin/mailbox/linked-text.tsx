import { Fragment } from "react";

const URL_RE = /(https?:\/\/[^\s<>"']+)/g;

/** Plain text with its http(s) links made clickable; nothing else is interpreted. */
export function LinkedText({ text }: { text: string }) {
  const parts = text.split(URL_RE);
  return (
    <>
      {parts.map((part, i) => {
        if (i % 2 === 0) return <Fragment key={i}>{part}</Fragment>;
        // Sentence punctuation after a link is not part of it.
        const m = /^(.*?)([.,;:!?)\]]*)$/.exec(part);
        const href = m?.[1] ?? part;
        const tail = m?.[2] ?? "";
        return (
          <Fragment key={i}>
            <a href={href} className="break-all font-medium text-copper-700 underline underline-offset-2 hover:text-copper-800">
              {href}
            </a>
            {tail}
          </Fragment>
        );
      })}
    </>
  );
}
