// Calling route handlers directly, as the server would, with real sessions from better-auth.
import { POST as authPost } from "@/app/api/auth/[...all]/route";
import { env } from "@/lib/env";

export const origin = new URL(env.APP_URL).origin;

type Init = { method?: string; body?: unknown; cookie?: string; headers?: Record<string, string>; rawBody?: string };

export function request(pathname: string, init: Init = {}): Request {
  const headers = new Headers(init.headers);
  if (init.cookie) headers.set("cookie", init.cookie);
  const method = init.method ?? (init.body !== undefined || init.rawBody !== undefined ? "POST" : "GET");
  if (method !== "GET" && !headers.has("origin")) headers.set("origin", origin);
  let body: string | undefined;
  if (init.rawBody !== undefined) body = init.rawBody;
  else if (init.body !== undefined) {
    body = JSON.stringify(init.body);
    if (!headers.has("content-type")) headers.set("content-type", "application/json");
  }
  return new Request(new URL(pathname, origin), { method, headers, body });
}

// Generic over the handler's params, so a handler typed `{ params: Promise<{ patientId: string }> }` fits.
type Handler<P> = (req: Request, ctx: { params: Promise<P> }) => Promise<Response>;

/** Calls a route handler; params are the dynamic segments of its folder. */
export function call<P = Record<string, string | string[]>>(
  handler: Handler<P>,
  pathname: string,
  init: Init & { params?: Partial<P> } = {},
) {
  return handler(request(pathname, init), { params: Promise.resolve((init.params ?? {}) as P) });
}

let ipCounter = 10;
/** Signs in through better-auth's own handler and returns the session cookie. */
export async function signIn(email: string, password: string, ip?: string): Promise<string> {
  const res = await authPost(
    request("/api/auth/sign-in/email", {
      body: { email, password },
      // Each sign-in from its own test address, so the sign-in rate limit does not trip here.
      headers: { "x-forwarded-for": ip ?? `10.99.0.${ipCounter++ % 250}` },
    }),
  );
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${await res.text()}`);
  const cookies = res.headers.getSetCookie().map((c) => c.split(";")[0]);
  return cookies.join("; ");
}

export const demo = {
  admin: { email: "admin@eastmere.example", password: "Eastmere-admin-2026" },
  wardNurse: { email: "ward.nurse@eastmere.example", password: "Eastmere-ward-2026" },
  communityNurse: { email: "community.nurse@eastmere.example", password: "Eastmere-community-2026" },
  rowanNurse: { email: "rowan.nurse@eastmere.example", password: "Eastmere-rowan-2026" },
  patient: { email: "arthur.pell@eastmere.example", password: "Eastmere-patient-2026" },
  patientAr: { email: "yusuf.haddad@eastmere.example", password: "Eastmere-patient-ar-2026" },
  carer: { email: "joan.pell@eastmere.example", password: "Eastmere-carer-2026" },
} as const;

const cookieCache = new Map<string, string>();
/** A session cookie for a demo account, signed in once per test file. */
export async function sessionFor(who: keyof typeof demo): Promise<string> {
  const hit = cookieCache.get(who);
  if (hit) return hit;
  const cookie = await signIn(demo[who].email, demo[who].password);
  cookieCache.set(who, cookie);
  return cookie;
}
