/** GET /api/health: 200 with the database round trip when healthy, 503 with the reason when not. */
import { NextResponse } from "next/server";
import { databaseRoundTripMs } from "@/lib/database";
import { queueHealth } from "@/lib/queue-health";

export const dynamic = "force-dynamic";

/** How long the health check waits for the database before it reports it unavailable. */
const HEALTH_TIMEOUT_MS = 3_000;

export async function GET(): Promise<NextResponse> {
  try {
    const ms = await Promise.race([
      databaseRoundTripMs(),
      new Promise<never>((_, reject) =>
        setTimeout(
          () => reject(new Error(`no answer within ${HEALTH_TIMEOUT_MS} ms`)),
          HEALTH_TIMEOUT_MS,
        ),
      ),
    ]);
    const queue = await queueHealth();
    return NextResponse.json({
      status: "ok",
      database: { roundTripMs: Number(ms.toFixed(2)) },
      queue,
    });
  } catch (err) {
    const reason = err instanceof Error ? err.message : String(err);
    return NextResponse.json({ status: "unavailable", reason }, { status: 503 });
  }
}
