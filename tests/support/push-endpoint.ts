// A fake push service for tests: an HTTPS server (self-signed certificate made with openssl for
// 127.0.0.1) that records each push it is sent, and a browser-side subscription (P-256 key pair
// and auth secret) whose payloads it can decrypt as RFC 8291 (aes128gcm, RFC 8188) says.
import { execFileSync } from "node:child_process";
import { createDecipheriv, createECDH, hkdfSync, randomBytes } from "node:crypto";
import fs from "node:fs";
import https from "node:https";
import os from "node:os";
import path from "node:path";

export type ReceivedPush = { path: string; headers: Record<string, string | string[] | undefined>; body: Buffer };

export async function startPushEndpoint() {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), "caddis-push-"));
  const keyFile = path.join(dir, "key.pem");
  const certFile = path.join(dir, "cert.pem");
  execFileSync("openssl", [
    "req", "-x509", "-newkey", "ec", "-pkeyopt", "ec_paramgen_curve:prime256v1", "-nodes", "-days", "1",
    "-subj", "/CN=127.0.0.1", "-addext", "subjectAltName=IP:127.0.0.1", "-keyout", keyFile, "-out", certFile,
  ], { stdio: "ignore" });
  const cert = fs.readFileSync(certFile);
  const received: ReceivedPush[] = [];
  const state = { status: 201 };
  const server = https.createServer({ key: fs.readFileSync(keyFile), cert }, (req, res) => {
    const chunks: Buffer[] = [];
    req.on("data", (c: Buffer) => chunks.push(c));
    req.on("end", () => {
      if (state.status < 300) received.push({ path: req.url ?? "", headers: req.headers, body: Buffer.concat(chunks) });
      res.writeHead(state.status).end();
    });
  });
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", () => r()));
  const port = (server.address() as { port: number }).port;
  fs.rmSync(dir, { recursive: true, force: true });
  return {
    url: `https://127.0.0.1:${port}`,
    received,
    state,
    /** Trusts only this server's certificate. */
    agent: new https.Agent({ ca: cert }),
    close: () => new Promise<void>((r) => server.close(() => r())),
  };
}

/** What a browser makes when it subscribes: a P-256 key pair and a 16-byte auth secret. */
export function browserKeys() {
  const ecdh = createECDH("prime256v1");
  ecdh.generateKeys();
  const auth = randomBytes(16);
  return { ecdh, p256dh: ecdh.getPublicKey().toString("base64url"), auth: auth.toString("base64url"), authSecret: auth };
}

/** RFC 8291 §3.4 + RFC 8188: decrypt one aes128gcm push message with the subscription's keys. */
export function decryptPush(body: Buffer, keys: ReturnType<typeof browserKeys>): string {
  const salt = body.subarray(0, 16);
  const idLength = body[20];
  const senderPublic = body.subarray(21, 21 + idLength);
  const ciphertext = body.subarray(21 + idLength);
  const uaPublic = keys.ecdh.getPublicKey();
  const ecdhSecret = keys.ecdh.computeSecret(senderPublic);
  const keyInfo = Buffer.concat([Buffer.from("WebPush: info\0"), uaPublic, senderPublic]);
  const ikm = Buffer.from(hkdfSync("sha256", ecdhSecret, keys.authSecret, keyInfo, 32));
  const cek = Buffer.from(hkdfSync("sha256", ikm, salt, Buffer.from("Content-Encoding: aes128gcm\0"), 16));
  const nonce = Buffer.from(hkdfSync("sha256", ikm, salt, Buffer.from("Content-Encoding: nonce\0"), 12));
  const decipher = createDecipheriv("aes-128-gcm", cek, nonce);
  decipher.setAuthTag(ciphertext.subarray(ciphertext.length - 16));
  const padded = Buffer.concat([decipher.update(ciphertext.subarray(0, ciphertext.length - 16)), decipher.final()]);
  // The last record ends with the delimiter 0x02 and then zero or more 0x00 of padding.
  let end = padded.length - 1;
  while (end >= 0 && padded[end] === 0) end--;
  if (padded[end] !== 2) throw new Error("not a last record");
  return padded.subarray(0, end).toString("utf8");
}
