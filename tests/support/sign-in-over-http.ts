// Signing in to a running app server over HTTP (end-to-end tests and the bench), both steps:
// the password, then for staff (and anyone who turned it on) the TOTP code computed from the
// account's secret (tests/support/totp.ts). Returns the session cookie.
import { totpCode, totpSecretFor } from "./totp";

const cookiesOf = (res: Response) => res.headers.getSetCookie().map((c) => c.split(";")[0]!);

export async function signInOverHttp({
  baseUrl,
  email,
  password,
  headers = {},
  totpSecret,
}: {
  baseUrl: string;
  email: string;
  password: string;
  headers?: Record<string, string>;
  totpSecret?: string;
}): Promise<string> {
  const common = { "content-type": "application/json", origin: baseUrl, ...headers };
  const res = await fetch(`${baseUrl}/api/auth/sign-in/email`, { method: "POST", headers: common, body: JSON.stringify({ email, password }) });
  if (res.status !== 200) throw new Error(`sign-in as ${email}: ${res.status} ${await res.text()}`);
  const first = cookiesOf(res);
  if (!((await res.json()) as { twoFactorRedirect?: boolean }).twoFactorRedirect) return first.join("; ");
  const secret = totpSecret ?? totpSecretFor(email);
  if (!secret) throw new Error(`${email} asks for a TOTP code and no secret is known`);
  const second = await fetch(`${baseUrl}/api/auth/two-factor/verify-totp`, {
    method: "POST",
    headers: { ...common, cookie: first.join("; ") },
    body: JSON.stringify({ code: totpCode(secret) }),
  });
  if (second.status !== 200) throw new Error(`second step for ${email}: ${second.status} ${await second.text()}`);
  return cookiesOf(second).filter((c) => c.includes("session_token")).join("; ");
}
