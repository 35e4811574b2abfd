"use client";
/**
 * Shown when a page fails while rendering. The proxy answers 503 before rendering when the
 * database is away; this covers the narrow window where it goes away after that check, and any
 * other failure. In production the server's error detail is hidden from the browser, so the
 * message names the likely passing cause and offers a retry rather than guessing.
 */
import { useEffect } from "react";

export default function PageError({
  error,
  reset,
}: {
  error: Error & { digest?: string };
  reset: () => void;
}) {
  useEffect(() => {
    console.error(error);
  }, [error]);
  return (
    <div className="narrow">
      <div className="notice" role="alert">
        <h1>This page could not be shown</h1>
        <p>
          If the database is restarting or unreachable, try again in a few seconds. What was saved
          stays saved; a change sent just now may need sending again.
        </p>
        {error.digest ? <p className="muted small">Reference: {error.digest}</p> : null}
        <div className="actions">
          <button type="button" className="primary" onClick={() => reset()}>
            Try again
          </button>
          <a className="button-link" href="/">
            Home
          </a>
        </div>
      </div>
    </div>
  );
}
