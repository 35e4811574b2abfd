import { DiffPage } from "@/app/components/entry/diff-view";

export const dynamic = "force-dynamic";

/** /entries/[entryId]/diff?from=N&to=M: what changed between two revisions. */
export default async function DiffRoute({
  params,
  searchParams,
}: {
  params: Promise<{ entryId: string }>;
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const { entryId } = await params;
  const q = await searchParams;
  const one = (v: string | string[] | undefined) =>
    typeof v === "string" && /^[1-9][0-9]*$/.test(v) ? v : null;
  return <DiffPage entryId={entryId} from={one(q.from)} to={one(q.to)} />;
}
