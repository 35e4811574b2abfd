/**
 * Reads the search API's snippet into plain pieces: the server sends HTML-escaped text with each
 * matched word inside `<mark>…</mark>`. We never hand that string to the browser as HTML; only
 * those two exact markers are understood, the five escapes are turned back into characters, and
 * anything else (an unexpected tag included) stays visible text.
 */

/** A run of snippet text, and whether it is a matched word. */
export interface SnippetPiece {
  text: string;
  marked: boolean;
}

const ENTITIES: Record<string, string> = {
  "&amp;": "&",
  "&lt;": "<",
  "&gt;": ">",
  "&quot;": '"',
  "&#39;": "'",
  "&#x27;": "'",
};

function unescapeText(s: string): string {
  return s.replace(/&(?:amp|lt|gt|quot|#39|#x27);/g, (e) => ENTITIES[e] ?? e);
}

/** The snippet's pieces in order; empty pieces are dropped, adjacent ones are not merged. */
export function snippetPieces(snippet: string): SnippetPiece[] {
  const out: SnippetPiece[] = [];
  let marked = false;
  for (const token of snippet.split(/(<mark>|<\/mark>)/)) {
    if (token === "<mark>") marked = true;
    else if (token === "</mark>") marked = false;
    else if (token !== "") out.push({ text: unescapeText(token), marked });
  }
  return out;
}
