/** better-auth's endpoints under /api/auth (sign-up/email, sign-in/email, sign-out, get-session, revoke-sessions, change-password), behind the auth gate. */
import { handleAuthRequest } from "@/lib/auth-request";

export const dynamic = "force-dynamic";

export function GET(req: Request): Promise<Response> {
  return handleAuthRequest(req);
}

export function POST(req: Request): Promise<Response> {
  return handleAuthRequest(req);
}
