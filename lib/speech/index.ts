import "server-only";
// Speech made on this server when the reader's browser has no voice for the page's language:
// espeak-ng from Debian's packages (scripts/ensure-tools.ts installs it), never an outside
// service. Each piece is made once and kept in the object store under speech/, keyed by a hash
// of the language and the words, so nothing of who asked is in the key.
import { spawn } from "node:child_process";
import { createHash } from "node:crypto";
import { getObjectStream, putObject } from "@/lib/storage";
import type { Locale } from "@/lib/i18n/routing";

/** espeak-ng's voice for each language Caddis speaks. */
export const SPEECH_VOICES: Record<Locale, string> = { en: "en-gb", es: "es", pl: "pl", ro: "ro", ar: "ar", ur: "ur" };
export const SPEECH_CONTENT_TYPE = "audio/wav";
const ENGINE = "/usr/bin/espeak-ng";
// Bump when the voice settings change, so older speech is not served.
const VERSION = "v1";

export function speechKey(locale: Locale, text: string) {
  const hash = createHash("sha256").update(`${VERSION}\n${locale}\n${text}`).digest("hex");
  return `speech/${locale}/${hash}.wav`;
}

/** Runs espeak-ng on the text (given on stdin, never as an argument) and returns the WAV bytes. */
function synthesise(locale: Locale, text: string): Promise<Buffer> {
  return new Promise((resolve, reject) => {
    // Slightly slower than espeak's default (175 words a minute) for older listeners.
    const child = spawn(ENGINE, ["-v", SPEECH_VOICES[locale], "-s", "150", "--stdin", "--stdout"], { stdio: ["pipe", "pipe", "pipe"] });
    const chunks: Buffer[] = [];
    let errors = "";
    const timer = setTimeout(() => child.kill("SIGKILL"), 20_000);
    child.stdout.on("data", (c: Buffer) => chunks.push(c));
    child.stderr.on("data", (c: Buffer) => (errors += c.toString()));
    child.on("error", (e) => {
      clearTimeout(timer);
      reject(e);
    });
    child.on("close", (code) => {
      clearTimeout(timer);
      const audio = Buffer.concat(chunks);
      if (code === 0 && audio.length > 44) resolve(audio);
      else reject(new Error(`espeak-ng exited ${code}: ${errors.slice(0, 200)}`));
    });
    child.stdin.end(text);
  });
}

async function readAll(stream: ReadableStream): Promise<Buffer> {
  const chunks: Uint8Array[] = [];
  const reader = stream.getReader();
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    chunks.push(value);
  }
  return Buffer.concat(chunks);
}

/**
 * The speech for one piece of text: from the store when made before, else made and kept.
 * `beforeMaking` runs only when it must be made (the route's rate limit).
 */
export async function speechAudio(locale: Locale, text: string, beforeMaking: () => Promise<void> = async () => {}): Promise<Buffer> {
  const key = speechKey(locale, text);
  const stored = await getObjectStream({ key });
  if (stored) return readAll(stored.body);
  await beforeMaking();
  const audio = await synthesise(locale, text);
  await putObject({ key, body: audio, contentType: SPEECH_CONTENT_TYPE });
  return audio;
}
