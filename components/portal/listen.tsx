"use client";
// "Listen": reads the page's main text aloud in the page's language, sentence by sentence, and
// marks the sentence being read (CSS Custom Highlight "listen", app/globals.css). The browser's
// own voice when it has one for the language; otherwise speech made on our server (/api/speech,
// espeak-ng, kept in the object store). The emergency number is read as separate digits.
import { useLocale, useTranslations } from "next-intl";
import { useCallback, useEffect, useRef, useState } from "react";
import { Button } from "@/components/ui/button";
import { sentencesOf, speakable, SPEECH_MAX_CHARS } from "@/lib/shared/speech";

type Piece = { text: string; range: Range };
type State = "idle" | "playing" | "paused";

// The blocks whose words are read, in document order; the control itself and anything marked
// data-listen="skip" (the nav, "waiting to send") are left out, as is text only for screen readers.
const BLOCKS = "h1, h2, h3, h4, p, li, dt, dd, th, td, legend, label, figcaption, summary, button, a, [data-listen-block]";

function pieces(root: HTMLElement): Piece[] {
  const out: Piece[] = [];
  const seen = new Set<Element>();
  for (const block of Array.from(root.querySelectorAll<HTMLElement>(BLOCKS))) {
    if (seen.has(block) || block.closest('[data-listen="skip"], .sr-only, [hidden], [aria-hidden="true"]')) continue;
    // Read a block once, at its outermost: an <a> inside a <p> is part of the <p>.
    const outer = block.parentElement?.closest(BLOCKS);
    if (outer && root.contains(outer) && !outer.closest('[data-listen="skip"]')) continue;
    seen.add(block);
    const nodes: { node: Text; start: number }[] = [];
    let text = "";
    const walker = document.createTreeWalker(block, NodeFilter.SHOW_TEXT);
    for (let n = walker.nextNode() as Text | null; n; n = walker.nextNode() as Text | null) {
      if (n.parentElement?.closest('.sr-only, [aria-hidden="true"], [data-listen="skip"]')) continue;
      nodes.push({ node: n, start: text.length });
      text += n.data;
    }
    const at = (offset: number) => {
      let hit = nodes[0];
      for (const n of nodes) if (n.start <= offset) hit = n;
      return { node: hit.node, offset: Math.min(offset - hit.start, hit.node.length) };
    };
    for (const s of sentencesOf(text)) {
      const range = document.createRange();
      const a = at(s.start);
      const b = at(s.end);
      range.setStart(a.node, a.offset);
      range.setEnd(b.node, b.offset);
      out.push({ text: text.slice(s.start, s.end).replace(/\s+/g, " ").slice(0, SPEECH_MAX_CHARS), range });
    }
  }
  return out;
}

function voiceFor(locale: string): SpeechSynthesisVoice | null {
  if (typeof speechSynthesis === "undefined") return null;
  return speechSynthesis.getVoices().find((v) => v.lang.toLowerCase().split(/[-_]/)[0] === locale) ?? null;
}

function mark(range: Range | null) {
  const registry = (CSS as unknown as { highlights?: Map<string, unknown> }).highlights;
  const Highlight = (globalThis as unknown as { Highlight?: new (...r: Range[]) => unknown }).Highlight;
  if (!registry || !Highlight) return;
  if (range) registry.set("listen", new Highlight(range));
  else registry.delete("listen");
}

export function ListenControl({ emergencyNumber }: { emergencyNumber: string | null }) {
  const t = useTranslations("Listen");
  const locale = useLocale();
  const [state, setState] = useState<State>("idle");
  const [failed, setFailed] = useState(false);
  const queue = useRef<Piece[]>([]);
  const index = useRef(0);
  const audio = useRef<HTMLAudioElement | null>(null);
  const engine = useRef<"browser" | "server">("server");
  const [engineShown, setEngineShown] = useState<"browser" | "server" | null>(null);
  const run = useRef(0);
  const speakNext = useRef<(i: number, token: number) => void>(() => {});

  const stop = useCallback(() => {
    run.current++;
    audio.current?.pause();
    audio.current = null;
    if (typeof speechSynthesis !== "undefined") speechSynthesis.cancel();
    mark(null);
    setState("idle");
  }, []);

  useEffect(() => stop, [stop]);

  const speak = useCallback(
    (i: number, token: number) => {
      if (token !== run.current) return;
      const piece = queue.current[i];
      if (!piece) {
        stop();
        return;
      }
      index.current = i;
      mark(piece.range);
      piece.range.startContainer.parentElement?.scrollIntoView({ block: "nearest", behavior: "smooth" });
      const next = () => speakNext.current(i + 1, token);
      const words = speakable(piece.text, emergencyNumber);
      if (engine.current === "browser") {
        const u = new SpeechSynthesisUtterance(words);
        u.lang = locale;
        const v = voiceFor(locale);
        if (v) u.voice = v;
        u.rate = 0.9;
        u.onend = next;
        u.onerror = next;
        speechSynthesis.speak(u);
      } else {
        const a = new Audio(`/api/speech?lang=${encodeURIComponent(locale)}&text=${encodeURIComponent(piece.text)}`);
        a.dataset.lang = locale;
        audio.current = a;
        a.onended = next;
        a.onerror = () => {
          if (token !== run.current) return;
          setFailed(true);
          stop();
        };
        a.play().catch((e: unknown) => {
          if (token !== run.current) return;
          // A pause while the sound still loads interrupts play(): the person's choice, not a failure.
          if (e instanceof DOMException && e.name === "AbortError") return;
          setFailed(true);
          stop();
        });
      }
    },
    [emergencyNumber, locale, stop],
  );
  useEffect(() => {
    speakNext.current = speak;
  }, [speak]);

  const start = () => {
    const main = document.getElementById("main") ?? document.body;
    queue.current = pieces(main);
    engine.current = voiceFor(locale) ? "browser" : "server";
    setEngineShown(engine.current);
    setFailed(false);
    setState("playing");
    speak(0, ++run.current);
  };

  const pause = () => {
    if (engine.current === "browser") speechSynthesis.pause();
    else audio.current?.pause();
    setState("paused");
  };

  const resume = () => {
    if (engine.current === "browser") speechSynthesis.resume();
    else void audio.current?.play();
    setState("playing");
  };

  return (
    <div className="mb-4 flex flex-wrap items-center gap-2" data-listen="skip" data-testid="listen" data-engine={state === "idle" ? undefined : (engineShown ?? undefined)}>
      {state === "idle" ? (
        <Button variant="secondary" onClick={start} data-testid="listen-start">
          <SpeakerIcon />
          {t("listen")}
        </Button>
      ) : (
        <>
          {state === "playing" ? (
            <Button variant="secondary" onClick={pause} data-testid="listen-pause">
              {t("pause")}
            </Button>
          ) : (
            <Button variant="secondary" onClick={resume} data-testid="listen-resume">
              {t("resume")}
            </Button>
          )}
          <Button variant="secondary" onClick={stop} data-testid="listen-stop">
            {t("stop")}
          </Button>
          <span className="text-ink-soft" role="status">
            {state === "playing" ? t("reading") : t("paused")}
          </span>
        </>
      )}
      {failed ? <p className="w-full text-sm font-bold text-level-emergency-ink">{t("failed")}</p> : null}
    </div>
  );
}

function SpeakerIcon() {
  return (
    <svg viewBox="0 0 24 24" className="h-6 w-6 shrink-0" aria-hidden="true" fill="none" stroke="currentColor" strokeWidth="2" strokeLinecap="round" strokeLinejoin="round">
      <path d="M4 9h4l5-4v14l-5-4H4z" fill="currentColor" />
      <path d="M16.5 8.5a5 5 0 0 1 0 7M19 6a8.5 8.5 0 0 1 0 12" />
    </svg>
  );
}
