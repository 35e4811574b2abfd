/**
 * Exports of one revision of an entry: its record file (YAML or JSON, written by the engine),
 * its analysis result (JSON) and its schematic (SVG from the stored layout).
 */
import {
  ENGINE_VERSION,
  renderSchematicSvg,
  serializeRecord,
  type SchematicLayout,
} from "@teardown/engine";
import type { Database } from "@teardown/db";
import { ApiError } from "./api-error";
import type { EntryRow } from "./access";
import { analysisFor } from "./entry-state";
import { revisionByNumber, storedRecord } from "./revisions";

/** What can be exported, by the file name the route takes. */
export const EXPORT_KINDS = [
  "record.yaml",
  "record.json",
  "analysis.json",
  "schematic.svg",
] as const;
export type ExportKind = (typeof EXPORT_KINDS)[number];

/** A file to send. */
export interface ExportFile {
  body: string;
  contentType: string;
  filename: string;
}

function baseName(entry: EntryRow, revision: number): string {
  const slug =
    entry.title
      .toLowerCase()
      .replace(/[^a-z0-9]+/g, "-")
      .replace(/^-+|-+$/g, "")
      .slice(0, 60) || "entry";
  return `${slug}-r${revision}`;
}

/** The export of one revision (the current one unless `revision` is given). */
export async function exportEntry(
  db: Database,
  entry: EntryRow,
  kind: ExportKind,
  revision?: number,
): Promise<ExportFile> {
  const row = await revisionByNumber(db, entry.id, revision ?? entry.currentRevision ?? 1);
  const name = baseName(entry, row.number);
  if (kind === "record.yaml" || kind === "record.json") {
    const format = kind === "record.yaml" ? "yaml" : "json";
    return {
      body: serializeRecord(storedRecord(row.record), format),
      contentType:
        format === "yaml" ? "application/yaml; charset=utf-8" : "application/json; charset=utf-8",
      filename: `${name}.${format}`,
    };
  }
  const analysis = await analysisFor(db, row.id, ENGINE_VERSION);
  if (analysis?.state !== "done") {
    throw new ApiError(
      409,
      "analysis-not-ready",
      `the analysis of revision ${row.number} is ${analysis?.state ?? "not queued"}; export it once it is done`,
      { state: analysis?.state ?? null },
    );
  }
  if (kind === "analysis.json") {
    const body = `${JSON.stringify({ entryId: entry.id, revision: row.number, engineVersion: analysis.engineVersion, result: analysis.result }, null, 2)}\n`;
    return {
      body,
      contentType: "application/json; charset=utf-8",
      filename: `${name}-analysis.json`,
    };
  }
  return {
    body: renderSchematicSvg(analysis.layout as SchematicLayout),
    contentType: "image/svg+xml; charset=utf-8",
    filename: `${name}-schematic.svg`,
  };
}
