/**
 * The app server: Next.js's request handler behind a small entry that knows the connection.
 *   - The client address is worked out here, from the TCP peer and (only when the peer is a
 *     listed trusted proxy) its forwarding header, and handed to the app in one internal header
 *     that is first removed from the incoming request, so no client can choose its address.
 *   - With an https APP_URL, a request that did not arrive over https is redirected there.
 * `npm start`, the end-to-end tests and the bench serve the app through this file
 * (`spawnAppServer` in scripts/app-server.ts); `next start` alone has no client address.
 *   node --import tsx scripts/server.ts --port 3000 --hostname 127.0.0.1 [--dev]
 */
// lib/ modules say `import "server-only"`; outside a React Server Components bundle that package
// throws on purpose, so this process maps it to its empty module, as the other scripts do.
import "./server-only-shim.cjs";
import http from "node:http";
import path from "node:path";
import { fileURLToPath } from "node:url";
import next from "next";
import {
  CLIENT_ADDRESS_HEADER,
  parseTrustedProxies,
  requestWasHttps,
  resolveClientAddress,
} from "../lib/http/client-address";

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), "..");

function arg(name: string): string | undefined {
  const i = process.argv.indexOf(name);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

const port = Number(arg("--port") ?? process.env.PORT ?? 3000);
const hostname = arg("--hostname") ?? process.env.HOST ?? "127.0.0.1";
const proxies = parseTrustedProxies(process.env.TRUSTED_PROXIES);
const forwardedForHeader = (process.env.CLIENT_IP_HEADER || "x-forwarded-for").trim().toLowerCase();
const appUrl = new URL(process.env.APP_URL ?? `http://localhost:${port}`);
const httpsOnly = appUrl.protocol === "https:";

/** Removes every copy of a header, from the parsed headers and the raw list Next.js may also read. */
function removeHeader(req: http.IncomingMessage, name: string) {
  delete req.headers[name];
  const raw = req.rawHeaders;
  const kept: string[] = [];
  for (let i = 0; i < raw.length; i += 2) if (raw[i]!.toLowerCase() !== name) kept.push(raw[i]!, raw[i + 1]!);
  req.rawHeaders.splice(0, raw.length, ...kept);
}

async function main() {
  // --dev: `npm run dev` (hot reload), with the same client address as production.
  const app = next({ dev: process.argv.includes("--dev"), dir: root, hostname, port });
  const handle = app.getRequestHandler();
  await app.prepare();

  const server = http.createServer((req, res) => {
    const peer = req.socket.remoteAddress;
    const address = resolveClientAddress({ peer, forwardedFor: req.headers[forwardedForHeader], proxies });
    removeHeader(req, CLIENT_ADDRESS_HEADER);
    req.headers[CLIENT_ADDRESS_HEADER] = address;
    req.rawHeaders.push(CLIENT_ADDRESS_HEADER, address);

    if (httpsOnly && !requestWasHttps({ peer, encrypted: false, forwardedProto: req.headers["x-forwarded-proto"], proxies })) {
      // To the configured origin, never the Host header's: a forged Host must not choose the target.
      res.writeHead(308, { Location: new URL(req.url ?? "/", appUrl.origin).toString(), "Cache-Control": "no-store" });
      res.end();
      return;
    }
    handle(req, res).catch((error: unknown) => {
      console.error("[server] request failed:", error);
      if (!res.headersSent) res.writeHead(500);
      res.end();
    });
  });
  server.listen(port, hostname, () => {
    const trusted = proxies.entries.length ? `trusting proxies ${proxies.entries.join(", ")}` : "no trusted proxy: client address is the TCP peer";
    console.log(`[server] Caddis listening on http://${hostname}:${port} for ${appUrl.origin} (${trusted})`);
  });
  for (const signal of ["SIGINT", "SIGTERM"] as const) {
    process.on(signal, () => {
      server.close();
      void app.close().finally(() => process.exit(0));
      // Open keep-alive connections must not hold the process.
      setTimeout(() => process.exit(0), 3_000).unref();
    });
  }
}

main().catch((error: unknown) => {
  console.error(`[server] ${error instanceof Error ? error.message : error}`);
  process.exit(1);
});
