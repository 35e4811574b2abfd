/**
 * Next runs `register` once when the server starts. Loading the engine into a record reader
 * thread takes seconds, so it is done here rather than inside the first upload's request.
 */
export async function register(): Promise<void> {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  const { warmRecordParsePool } = await import("./lib/record-parse/record-parse-pool");
  warmRecordParsePool();
}
