/**
 * A small Markdown reader for an entry's summary that builds React elements and never HTML
 * text: paragraphs, "-"/"*" and numbered lists, headings, **bold**, *italic*, `code` and
 * [links](https://...) with http(s) addresses only. Anything else, raw HTML included, shows as
 * the text it is, so a summary cannot inject markup or script.
 */
import type { ReactNode } from "react";

const SAFE_URL = /^https?:\/\/[^\s]+$/i;
// Inline pieces, first match wins: code, bold, italic, link.
const INLINE = /(`[^`]+`)|(\*\*[^*]+\*\*)|(\*[^*\s][^*]*\*|_[^_\s][^_]*_)|(\[[^\]]+\]\([^)\s]+\))/;

/** Inline Markdown of one line as React nodes. */
export function inline(text: string, key = "i"): ReactNode[] {
  const out: ReactNode[] = [];
  let rest = text;
  let n = 0;
  while (rest.length > 0) {
    const m = INLINE.exec(rest);
    if (m === null) {
      out.push(rest);
      break;
    }
    if (m.index > 0) out.push(rest.slice(0, m.index));
    const tok = m[0];
    const k = `${key}-${n++}`;
    if (m[1]) out.push(<code key={k}>{tok.slice(1, -1)}</code>);
    else if (m[2]) out.push(<strong key={k}>{inline(tok.slice(2, -2), k)}</strong>);
    else if (m[3]) out.push(<em key={k}>{inline(tok.slice(1, -1), k)}</em>);
    else {
      const label = tok.slice(1, tok.indexOf("]("));
      const url = tok.slice(tok.indexOf("](") + 2, -1);
      out.push(
        SAFE_URL.test(url) ? (
          <a key={k} href={url} rel="noopener noreferrer nofollow" target="_blank">
            {inline(label, k)}
          </a>
        ) : (
          tok
        ),
      );
    }
    rest = rest.slice(m.index + tok.length);
  }
  return out;
}

type Block =
  | { kind: "p"; lines: string[] }
  | { kind: "ul" | "ol"; items: string[] }
  | { kind: "h"; level: number; text: string };

/** The blocks of a Markdown text: blank lines split paragraphs; list items and headings stand alone. */
export function blocksOf(text: string): Block[] {
  const blocks: Block[] = [];
  for (const raw of text.replace(/\r\n?/g, "\n").split("\n")) {
    const line = raw.trimEnd();
    const last = blocks[blocks.length - 1];
    const bullet = /^\s*[-*+]\s+(.*)$/.exec(line);
    const numbered = /^\s*\d+[.)]\s+(.*)$/.exec(line);
    const heading = /^(#{1,6})\s+(.*)$/.exec(line);
    if (line.trim() === "") blocks.push({ kind: "p", lines: [] });
    else if (heading) blocks.push({ kind: "h", level: heading[1]!.length, text: heading[2]! });
    else if (bullet || numbered) {
      const kind = bullet ? "ul" : "ol";
      const item = (bullet ?? numbered)![1]!;
      if (last?.kind === kind) last.items.push(item);
      else blocks.push({ kind, items: [item] });
    } else if (last?.kind === "p") last.lines.push(line.trim());
    else if ((last?.kind === "ul" || last?.kind === "ol") && /^\s+/.test(raw))
      last.items[last.items.length - 1] += ` ${line.trim()}`;
    else blocks.push({ kind: "p", lines: [line.trim()] });
  }
  return blocks.filter((b) => b.kind !== "p" || b.lines.length > 0);
}

/** The summary as React elements (headings drop to h4 and below, under the page's own). */
export function SafeMarkdown({ text }: { text: string }) {
  return (
    <div data-testid="record-summary">
      {blocksOf(text).map((b, i) => {
        const k = `b${i}`;
        if (b.kind === "p") return <p key={k}>{inline(b.lines.join(" "), k)}</p>;
        if (b.kind === "h") return <h4 key={k}>{inline(b.text, k)}</h4>;
        const items = b.items.map((it, j) => <li key={j}>{inline(it, `${k}-${j}`)}</li>);
        return b.kind === "ul" ? <ul key={k}>{items}</ul> : <ol key={k}>{items}</ol>;
      })}
    </div>
  );
}
