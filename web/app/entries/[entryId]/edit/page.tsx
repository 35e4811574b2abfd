import { EditEntry } from "@/app/components/entry/edit-entry";

export const dynamic = "force-dynamic";

/** /entries/[entryId]/edit: the form editor on the current revision. */
export default async function EditRoute({ params }: { params: Promise<{ entryId: string }> }) {
  const { entryId } = await params;
  return <EditEntry entryId={entryId} />;
}
