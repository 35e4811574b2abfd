"use client";
// Owners: download the whole team as one archive, or load an archive into this team while it
// has no entries (moving a team between instances; the format is in docs/team-archive.md).
import { useState, type ChangeEvent } from "react";

type State =
  | { kind: "idle" }
  | { kind: "busy" }
  | { kind: "done"; text: string }
  | { kind: "error"; text: string };

/** The export link and the import picker. */
export function TeamArchivePanel(props: { teamId: string }) {
  const [state, setState] = useState<State>({ kind: "idle" });
  async function onPick(ev: ChangeEvent<HTMLInputElement>) {
    const file = ev.currentTarget.files?.[0];
    if (!file) return;
    setState({ kind: "busy" });
    try {
      const res = await fetch(`/api/teams/${props.teamId}/import`, {
        method: "POST",
        headers: { "content-type": "application/x-teardown-team-archive" },
        body: file,
      });
      const body = (await res.json().catch(() => null)) as {
        imported?: { entries: number; revisions: number; photos: number };
        error?: { message: string };
      } | null;
      if (res.ok && body?.imported)
        setState({
          kind: "done",
          text: `Imported ${body.imported.entries} entries, ${body.imported.revisions} revisions and ${body.imported.photos} photos. Reload to see them.`,
        });
      else
        setState({ kind: "error", text: body?.error?.message ?? `import failed (${res.status})` });
    } catch {
      setState({ kind: "error", text: "the server could not be reached" });
    }
  }
  return (
    <div className="stack">
      <p>
        <a className="button" href={`/api/teams/${props.teamId}/export`} download>
          Download the team archive
        </a>
      </p>
      <label>
        Import an archive into this team (only while it has no entries){" "}
        <input type="file" accept=".jsonl" onChange={onPick} disabled={state.kind === "busy"} />
      </label>
      {state.kind === "busy" && <p>Importing ...</p>}
      {state.kind === "done" && <p role="status">{state.text}</p>}
      {state.kind === "error" && <p role="alert">{state.text}</p>}
    </div>
  );
}
