// Calling route handlers directly, as the server would, with real sessions from better-auth.
import { POST as authPost } from "@/app/api/auth/[...all]/route";
import { env } from "@/lib/config/env";
import { rememberTotpSecret, totpCode, totpSecretFor } from "./totp";

export { totpCode };
import { CLIENT_ADDRESS_HEADER } from "@/lib/http/client-ip";

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
/**
 * Signs in through better-auth's own handler and returns the session cookie. An account with
 * two-step sign-in gets its code computed from `totp` (a base32 secret), else from the secret the
 * seed or createStaff registered for the address (tests/support/totp.ts).
 */
export async function signIn(email: string, password: string, ip?: string, totp?: string): Promise<string> {
  // Each sign-in from its own test address, so the sign-in rate limit does not trip here.
  const headers = { [CLIENT_ADDRESS_HEADER]: ip ?? `10.99.0.${ipCounter++ % 250}` };
  const res = await authPost(request("/api/auth/sign-in/email", { body: { email, password }, headers }));
  if (res.status !== 200) throw new Error(`sign-in as ${email} failed: ${res.status} ${await res.text()}`);
  const cookies = res.headers.getSetCookie().map((c) => c.split(";")[0]);
  const body = (await res.json()) as { twoFactorRedirect?: boolean };
  if (!body.twoFactorRedirect) return cookies.join("; ");
  const secret = totp ?? totpSecretFor(email);
  if (!secret) throw new Error(`sign-in as ${email} needs a TOTP code and no secret is known`);
  const second = await authPost(
    request("/api/auth/two-factor/verify-totp", { body: { code: totpCode(secret) }, cookie: cookies.join("; "), headers }),
  );
  if (second.status !== 200) throw new Error(`second step for ${email} failed: ${second.status} ${await second.text()}`);
  return second.headers
    .getSetCookie()
    .map((c) => c.split(";")[0])
    .filter((c) => c.includes("session_token"))
    .join("; ");
}

/**
 * Sets up two-step sign-in for a signed-in account through better-auth's own endpoints, as the
 * set-up page does: enable with the password, confirm with a code. Returns the secret (also
 * registered for later sign-ins) and the new session cookie.
 */
export async function enrolTotpOverApi(cookie: string, password: string, email?: string) {
  const headers = { [CLIENT_ADDRESS_HEADER]: `10.99.1.${ipCounter++ % 250}` };
  const enable = await authPost(request("/api/auth/two-factor/enable", { body: { password }, cookie, headers }));
  if (enable.status !== 200) throw new Error(`two-factor enable failed: ${enable.status} ${await enable.text()}`);
  const { totpURI } = (await enable.json()) as { totpURI: string };
  const uri = new URL(totpURI);
  const secret = uri.searchParams.get("secret")!;
  const verify = await authPost(request("/api/auth/two-factor/verify-totp", { body: { code: totpCode(secret) }, cookie, headers }));
  if (verify.status !== 200) throw new Error(`two-factor confirm failed: ${verify.status} ${await verify.text()}`);
  rememberTotpSecret(email ?? decodeURIComponent(uri.pathname.split(":").pop()!), secret);
  const newCookie = verify.headers.getSetCookie().map((c) => c.split(";")[0]).filter((c) => c.includes("session_token")).join("; ");
  return { secret, cookie: newCookie };
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
