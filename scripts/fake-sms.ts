/**
 * A fake SMS service on loopback for `npm start` and `npm test` (started by scripts/services.ts,
 * like maildev): it answers the hosted service's send call (POST /sms/json) as the real one does,
 * keeps what was sent in memory, lists it on a web page (GET /) and as JSON (GET /api/messages,
 * ?to=<number without +> to filter). DELETE /api/messages empties it.
 *
 *   node --import tsx scripts/fake-sms.ts --port 4590
 */
import { randomUUID } from "node:crypto";
import http from "node:http";
import path from "node:path";
import { fileURLToPath } from "node:url";

export type FakeSms = { id: string; to: string; from: string; text: string; clientRef: string | null; at: string };

const escape = (s: string) => s.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

function page(messages: FakeSms[]) {
  const rows = messages
    .map((m) => `<tr><td>${escape(m.at)}</td><td>+${escape(m.to)}</td><td>${escape(m.from)}</td><td dir="auto">${escape(m.text)}</td></tr>`)
    .join("");
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width"><title>Fake SMS service</title>
<style>body{font-family:sans-serif;margin:1rem}table{border-collapse:collapse;width:100%}td,th{border:1px solid #999;padding:.3rem;text-align:start;vertical-align:top}</style></head>
<body><h1>Texts sent (${messages.length})</h1><p>Local fake: nothing here reached a phone.</p>
<table><thead><tr><th>When</th><th>To</th><th>From</th><th>Text</th></tr></thead><tbody>${rows}</tbody></table></body></html>`;
}

async function readBody(req: http.IncomingMessage): Promise<Record<string, string>> {
  const chunks: Buffer[] = [];
  for await (const c of req) chunks.push(c as Buffer);
  const raw = Buffer.concat(chunks).toString("utf8");
  if ((req.headers["content-type"] ?? "").includes("json")) return raw ? (JSON.parse(raw) as Record<string, string>) : {};
  return Object.fromEntries(new URLSearchParams(raw));
}

/** Starts the fake; `failWith` (a status) makes every send fail, to play an outage. */
export function startFakeSms({ port, host = "127.0.0.1" }: { port: number; host?: string }) {
  const messages: FakeSms[] = [];
  const state = { failWith: 0 };
  const server = http.createServer((req, res) => {
    const url = new URL(req.url ?? "/", "http://fake");
    void (async () => {
      if (req.method === "POST" && url.pathname === "/sms/json") {
        if (state.failWith) {
          res.writeHead(state.failWith, { "content-type": "application/json" }).end(JSON.stringify({ error: "unavailable" }));
          return;
        }
        const body = await readBody(req);
        const to = String(body.to ?? "");
        if (!/^[1-9][0-9]{6,14}$/.test(to) || !body.text) {
          res.writeHead(200, { "content-type": "application/json" }).end(
            JSON.stringify({ "message-count": "1", messages: [{ status: "3", "error-text": "Invalid to or text" }] }),
          );
          return;
        }
        const id = randomUUID();
        messages.push({ id, to, from: String(body.from ?? ""), text: String(body.text), clientRef: body["client-ref"] ?? null, at: new Date().toISOString() });
        res.writeHead(200, { "content-type": "application/json" }).end(
          JSON.stringify({ "message-count": "1", messages: [{ to, "message-id": id, status: "0", "remaining-balance": "10.0", "message-price": "0.0", network: "00000" }] }),
        );
        return;
      }
      if (url.pathname === "/api/messages") {
        if (req.method === "DELETE") {
          messages.length = 0;
          res.writeHead(204).end();
          return;
        }
        const to = url.searchParams.get("to");
        res.writeHead(200, { "content-type": "application/json" }).end(JSON.stringify(to ? messages.filter((m) => m.to === to) : messages));
        return;
      }
      if (req.method === "GET" && url.pathname === "/") {
        res.writeHead(200, { "content-type": "text/html; charset=utf-8" }).end(page([...messages].reverse()));
        return;
      }
      res.writeHead(404).end();
    })().catch(() => res.writeHead(400).end());
  });
  return new Promise<{ server: http.Server; messages: FakeSms[]; state: typeof state; close: () => Promise<void> }>((resolve) => {
    server.listen(port, host, () =>
      resolve({ server, messages, state, close: () => new Promise<void>((r) => server.close(() => r())) }),
    );
  });
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const i = process.argv.indexOf("--port");
  const port = Number(i > 0 ? process.argv[i + 1] : 4590);
  void startFakeSms({ port }).then(() => console.log(`[fake-sms] listening on 127.0.0.1:${port}`));
}
