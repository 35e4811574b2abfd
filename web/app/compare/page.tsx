import { ComparePage } from "@/app/components/compare/compare-view";

export const dynamic = "force-dynamic";

/** /compare?a=ENTRY_ID&b=ENTRY_ID[&aRevision=N&bRevision=M]: two teardowns side by side. */
export default async function CompareRoute({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const q = await searchParams;
  const text = (v: string | string[] | undefined) =>
    typeof v === "string" && v.length > 0 && v.length <= 100 ? v : null;
  const number = (v: string | string[] | undefined) =>
    typeof v === "string" && /^[1-9][0-9]{0,8}$/.test(v) ? Number(v) : null;
  const a = text(q.a);
  if (a === null)
    return (
      <>
        <h1>Compare two teardowns</h1>
        <p>Open an entry and choose “compare with…”, or pick two entries in the search results.</p>
      </>
    );
  return (
    <ComparePage
      target={{ a, b: text(q.b), aRevision: number(q.aRevision), bRevision: number(q.bRevision) }}
    />
  );
}
