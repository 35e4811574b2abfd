/**
 * The page answered while the database is restarting or unreachable: 503 with Retry-After, a
 * short readable message in the app's colours, and the same content security policy as any page
 * (its one inline style carries the request's nonce, so no policy is loosened for it).
 */

/** Seconds a browser or client should wait before asking again (what the API's 503 says too). */
export const OUTAGE_RETRY_AFTER_SECONDS = 5;

/** The message a person sees; tests look for it. */
export const OUTAGE_MESSAGE =
  "The database is restarting or unreachable; try again in a few seconds.";

/** The HTML of the outage page. The nonce goes on the style element only; there is no script. */
export function outagePageHtml(nonce: string): string {
  // Colours and fonts follow globals.css (the house look), written out because the build's
  // stylesheet is not linked from an answer made outside the page renderer.
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<meta http-equiv="refresh" content="${OUTAGE_RETRY_AFTER_SECONDS * 2}">
<title>Teardown Ledger: temporarily unavailable</title>
<style nonce="${nonce}">
body{margin:0;min-height:100vh;display:flex;flex-direction:column;background:#f7f6f2;color:#1f2328;
font-family:system-ui,-apple-system,"Segoe UI",Roboto,"Helvetica Neue",Arial,sans-serif;line-height:1.45}
header{border-bottom:1px solid #dcd8ce;background:#fff;padding:.75rem 1.25rem;font-weight:600}
header a{color:#1f2328;text-decoration:none}
main{max-width:40rem;margin:3rem auto;padding:0 1.25rem}
.card{background:#fff;border:1px solid #dcd8ce;border-left:4px solid #9a6700;border-radius:6px;padding:1rem 1.25rem}
h1{font-size:1.3rem;margin:0 0 .5rem}
p{margin:.5rem 0}
a{color:#1d5c63}
.muted{color:#5c6670;font-size:.9rem}
</style>
</head>
<body>
<header><a href="/">Teardown Ledger</a></header>
<main>
<div class="card" role="alert">
<h1>Temporarily unavailable</h1>
<p>${OUTAGE_MESSAGE}</p>
<p class="muted">What was saved stays saved; a change sent just now may need sending again. This page reloads itself, or <a href="">try again now</a>.</p>
</div>
</main>
</body>
</html>
`;
}
