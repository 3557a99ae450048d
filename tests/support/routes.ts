// Every route handler under app/api, found on disk, so a new route cannot escape the security
// matrix: the matrix test fails while a route has no row.
import fs from "node:fs";
import path from "node:path";

export const apiRoot = path.resolve(__dirname, "../../app/api");
export const methods = ["GET", "POST", "PUT", "PATCH", "DELETE"] as const;
export type Method = (typeof methods)[number];

export type RouteFile = { pattern: string; file: string };

export function listRouteFiles(dir = apiRoot): RouteFile[] {
  const out: RouteFile[] = [];
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) out.push(...listRouteFiles(full));
    else if (entry.name === "route.ts") {
      const rel = path.relative(apiRoot, path.dirname(full)).split(path.sep).join("/");
      out.push({ pattern: `/api/${rel}`, file: full });
    }
  }
  return out.sort((a, b) => a.pattern.localeCompare(b.pattern));
}

/** "/api/patients/[patientId]" + { patientId: "x" } → "/api/patients/x" */
export function fillPattern(pattern: string, params: Record<string, string | string[]>) {
  return pattern.replace(/\[\.\.\.(\w+)\]|\[(\w+)\]/g, (_m, rest, name) => {
    const v = params[rest ?? name];
    if (v === undefined) throw new Error(`no value for ${rest ?? name} in ${pattern}`);
    return Array.isArray(v) ? v.join("/") : v;
  });
}
