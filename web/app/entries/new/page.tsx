import { NewEntry } from "@/app/components/entry/new-entry";

export const dynamic = "force-dynamic";

/** /entries/new?team=ID: create an entry by upload or with the form editor. */
export default async function NewEntryPage({
  searchParams,
}: {
  searchParams: Promise<Record<string, string | string[] | undefined>>;
}) {
  const team = (await searchParams).team;
  const teamId = typeof team === "string" ? team : null;
  if (teamId === null) {
    return (
      <>
        <h1>New entry</h1>
        <p>
          Pick the team the entry belongs to first: open it from <a href="/teams">your teams</a> and
          follow &quot;New entry&quot;.
        </p>
      </>
    );
  }
  return <NewEntry teamId={teamId} />;
}
