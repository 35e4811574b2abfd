/** better-auth's endpoints under /api/auth: sign-up/email, sign-in/email, sign-out, get-session, revoke-sessions, change-password. */
import { auth } from "@/lib/auth";

export const dynamic = "force-dynamic";

export function GET(req: Request): Promise<Response> {
  return auth().handler(req);
}

export function POST(req: Request): Promise<Response> {
  return auth().handler(req);
}
