/**
 * The pieces of a small Markdown text, as data: blocks (paragraphs, lists, headings) and inline
 * tokens (text, `code`, **bold**, *italic*, [links](https://...)). No HTML is ever produced or
 * passed through: raw HTML stays a text token, and a link is a link only with an http(s)
 * address. `safe-markdown.tsx` turns these into React elements.
 */

/** One block of the text. */
export type MarkdownBlock =
  | { kind: "p"; lines: string[] }
  | { kind: "ul" | "ol"; items: string[] }
  | { kind: "h"; level: number; text: string };

/** One inline piece of a line. */
export type InlineToken =
  | { kind: "text" | "code"; text: string }
  | { kind: "strong" | "em"; children: InlineToken[] }
  | { kind: "link"; href: string; children: InlineToken[] };

const SAFE_URL = /^https?:\/\/[^\s]+$/i;
// Inline pieces, first match wins: code, bold, italic, link.
const INLINE = /(`[^`]+`)|(\*\*[^*]+\*\*)|(\*[^*\s][^*]*\*|_[^_\s][^_]*_)|(\[[^\]]+\]\([^)\s]+\))/;

/** True for an address a summary may link to (http and https only). */
export function safeHref(url: string): boolean {
  return SAFE_URL.test(url);
}

/** The inline tokens of one line. */
export function inlineTokens(text: string): InlineToken[] {
  const out: InlineToken[] = [];
  let rest = text;
  while (rest.length > 0) {
    const m = INLINE.exec(rest);
    if (m === null) {
      out.push({ kind: "text", text: rest });
      break;
    }
    if (m.index > 0) out.push({ kind: "text", text: rest.slice(0, m.index) });
    const tok = m[0];
    if (m[1]) out.push({ kind: "code", text: tok.slice(1, -1) });
    else if (m[2]) out.push({ kind: "strong", children: inlineTokens(tok.slice(2, -2)) });
    else if (m[3]) out.push({ kind: "em", children: inlineTokens(tok.slice(1, -1)) });
    else {
      const label = tok.slice(1, tok.indexOf("]("));
      const href = tok.slice(tok.indexOf("](") + 2, -1);
      out.push(
        safeHref(href)
          ? { kind: "link", href, children: inlineTokens(label) }
          : { kind: "text", text: tok },
      );
    }
    rest = rest.slice(m.index + tok.length);
  }
  return out;
}

/** The blocks of a text: blank lines split paragraphs; list items and headings stand alone. */
export function markdownBlocks(text: string): MarkdownBlock[] {
  const blocks: MarkdownBlock[] = [];
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
