// The header on every page: the product's name, and what the visitor can do from here.
import Link from "next/link";
import { currentCaller } from "./current-caller";
import { SignOutButton } from "./sign-out-button";

/** The site header; its links depend on whether someone is signed in. */
export async function SiteHeader() {
  const caller = await currentCaller();
  return (
    <header className="site-header">
      <div className="site-header-inner">
        <Link href="/" className="brand">
          <span className="brand-mark" aria-hidden="true" />
          Teardown Ledger
        </Link>
        <nav aria-label="Main">
          <Link href="/search">Search</Link>
          {caller ? (
            <>
              <Link href="/teams">Teams</Link>
              <Link href="/settings">Settings</Link>
              <span className="who" title={caller.email}>
                {caller.name}
              </span>
              <SignOutButton />
            </>
          ) : (
            <>
              <Link href="/sign-in">Sign in</Link>
              <Link href="/sign-up" className="button-link">
                Sign up
              </Link>
            </>
          )}
        </nav>
      </div>
    </header>
  );
}
