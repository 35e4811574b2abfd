/** The bar that says how many entries are picked and links to the compare page once two are. */
import Link from "next/link";
import { compareHref } from "./search-url";
import css from "./search.module.css";

export function CompareBar({ picked, onClear }: { picked: string[]; onClear: () => void }) {
  return (
    <div className={css.compareBar} role="status" aria-live="polite">
      {picked.length === 2 ? (
        <Link className="button-link primary" href={compareHref(picked[0]!, picked[1]!)}>
          Compare the two picked entries
        </Link>
      ) : (
        <span className="muted">Pick two entries to compare ({picked.length} of 2 picked).</span>
      )}
      {picked.length > 0 && (
        <button type="button" className="link-button" onClick={onClear}>
          Clear picks
        </button>
      )}
    </div>
  );
}
