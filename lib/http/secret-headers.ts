import "server-only";
// The passport card (/p/… and /<locale>/p/…): never cached, never indexed, never sent on as a
// referrer. Used by proxy.ts on every response for these paths, the locale redirect included.
const passportPaths = /^\/((en|es|pl|ro|ar|ur)\/)?p(\/|$)/;

export function withPassportHeaders<R extends { headers: Headers }>(pathname: string, response: R): R {
  if (!passportPaths.test(pathname)) return response;
  response.headers.set("Referrer-Policy", "no-referrer");
  response.headers.set("Cache-Control", "no-store");
  response.headers.set("X-Robots-Tag", "noindex");
  return response;
}
