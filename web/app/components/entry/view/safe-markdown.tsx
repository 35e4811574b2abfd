/**
 * An entry's summary, Markdown read by `markdown-blocks.ts`, as React elements: never HTML text,
 * so raw HTML in a summary shows as the text it is and cannot inject markup or script.
 */
import type { ReactNode } from "react";
import { inlineTokens, markdownBlocks, type InlineToken } from "./markdown-blocks";

function render(tokens: InlineToken[], key: string): ReactNode[] {
  return tokens.map((t, i) => {
    const k = `${key}-${i}`;
    switch (t.kind) {
      case "text":
        return t.text;
      case "code":
        return <code key={k}>{t.text}</code>;
      case "strong":
        return <strong key={k}>{render(t.children, k)}</strong>;
      case "em":
        return <em key={k}>{render(t.children, k)}</em>;
      case "link":
        return (
          <a key={k} href={t.href} rel="noopener noreferrer nofollow" target="_blank">
            {render(t.children, k)}
          </a>
        );
    }
  });
}

/** The summary (headings drop to h4, under the page's own). */
export function SafeMarkdown({ text }: { text: string }) {
  return (
    <div data-testid="record-summary">
      {markdownBlocks(text).map((b, i) => {
        const k = `b${i}`;
        if (b.kind === "p") return <p key={k}>{render(inlineTokens(b.lines.join(" ")), k)}</p>;
        if (b.kind === "h") return <h4 key={k}>{render(inlineTokens(b.text), k)}</h4>;
        const items = b.items.map((it, j) => (
          <li key={j}>{render(inlineTokens(it), `${k}-${j}`)}</li>
        ));
        return b.kind === "ul" ? <ul key={k}>{items}</ul> : <ol key={k}>{items}</ol>;
      })}
    </div>
  );
}
