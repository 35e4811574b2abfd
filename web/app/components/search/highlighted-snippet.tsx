/** A search snippet with its matched words in <mark> elements, built as React nodes (no raw HTML). */
import { snippetPieces } from "./snippet-parts";
import css from "./search.module.css";

export function HighlightedSnippet({ snippet }: { snippet: string }) {
  const pieces = snippetPieces(snippet);
  if (pieces.length === 0) return null;
  return (
    <p className={css.snippet} data-testid="snippet">
      {pieces.map((p, i) =>
        p.marked ? (
          <mark key={i} className={css.word}>
            {p.text}
          </mark>
        ) : (
          <span key={i}>{p.text}</span>
        ),
      )}
    </p>
  );
}
