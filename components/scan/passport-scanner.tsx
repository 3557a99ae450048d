"use client";
// The Scan page: the passport's QR read by the camera in the browser (@zxing/browser, loaded only
// when the camera is opened), or the short code typed. Either way the device card opens; the
// full record is one more step there (a reason, 24 hours of visit access).
import { useLocale, useTranslations } from "next-intl";
import { useEffect, useRef, useState } from "react";
import { Button, buttonClass } from "@/components/ui/button";
import { FieldError } from "@/components/ui/field";

// As lib/passport's normalising (which is server-only): case, spaces and dashes ignored. The
// server checks the alphabet itself.
const normalise = (typed: string) => typed.toUpperCase().replace(/[^0-9A-Z]/g, "");

/** The token in a passport QR (…/p/<43 characters>, with or without a locale), or null. */
export function tokenFromQr(text: string): string | null {
  let path = text.trim();
  try {
    path = new URL(path).pathname;
  } catch {
    // Not a URL: not ours.
    return null;
  }
  const m = /^\/(?:[a-z]{2}\/)?p\/([A-Za-z0-9_-]{43})\/?$/.exec(path);
  return m ? m[1]! : null;
}

type Controls = { stop: () => void };

function Camera({ onText }: { onText: (text: string) => void }) {
  const t = useTranslations("Scan");
  const videoRef = useRef<HTMLVideoElement>(null);
  const [failed, setFailed] = useState(false);
  const onTextRef = useRef(onText);
  onTextRef.current = onText;

  useEffect(() => {
    let controls: Controls | null = null;
    let cancelled = false;
    (async () => {
      if (!navigator.mediaDevices?.getUserMedia) return setFailed(true);
      try {
        const { BrowserQRCodeReader } = await import("@zxing/browser");
        if (cancelled || !videoRef.current) return;
        const reader = new BrowserQRCodeReader(undefined, { delayBetweenScanAttempts: 150 });
        controls = await reader.decodeFromConstraints({ video: { facingMode: { ideal: "environment" } } }, videoRef.current, (result) => {
          if (result) onTextRef.current(result.getText());
        });
        if (cancelled) controls.stop();
      } catch {
        setFailed(true);
      }
    })();
    return () => {
      cancelled = true;
      controls?.stop();
    };
  }, []);

  return (
    <div className="flex flex-col gap-2" data-testid="scan-camera">
      <video ref={videoRef} aria-label={t("videoLabel")} className="aspect-video w-full max-w-md rounded-lg bg-ink object-cover" muted playsInline />
      <p aria-live="polite" className={failed ? "font-bold text-level-emergency-ink" : "text-ink-soft"}>
        {failed ? t("cameraError") : t("cameraHint")}
      </p>
    </div>
  );
}

export function PassportScanner() {
  const t = useTranslations("Scan");
  const locale = useLocale();
  const [camera, setCamera] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  const [code, setCode] = useState("");
  const [codeError, setCodeError] = useState(false);
  const handled = useRef(false);

  const onQr = (text: string) => {
    if (handled.current) return;
    const token = tokenFromQr(text);
    if (!token) return setMessage(t("notPassport"));
    handled.current = true;
    setMessage(t("found"));
    setCamera(false);
    window.location.assign(`/${locale}/p/${token}`);
  };

  const onCode = (e: React.FormEvent) => {
    e.preventDefault();
    if (normalise(code).length !== 12) return setCodeError(true);
    setCodeError(false);
    window.location.assign(`/${locale}/p/${normalise(code)}`);
  };

  return (
    <div className="flex max-w-xl flex-col gap-6">
      <section className="flex flex-col gap-3">
        {camera ? <Camera onText={onQr} /> : null}
        <Button variant={camera ? "secondary" : "primary"} onClick={() => setCamera((c) => !c)} className="self-start" data-testid="scan-toggle">
          {camera ? t("stop") : t("start")}
        </Button>
        {message ? (
          <p role="status" className="font-bold" data-testid="scan-message">
            {message}
          </p>
        ) : null}
      </section>
      <form onSubmit={onCode} noValidate className="flex flex-col gap-3 rounded-card border border-stone-faint bg-paper-raised p-4">
        <h2 className="text-xl font-bold">{t("codeTitle")}</h2>
        <label htmlFor="scan-code" className="font-bold">
          {t("codeLabel")}
        </label>
        <p id="scan-code-hint" className="text-ink-soft">
          {t("codeHint")}
        </p>
        <input
          id="scan-code"
          value={code}
          onChange={(e) => setCode(e.target.value)}
          autoComplete="off"
          autoCapitalize="characters"
          spellCheck={false}
          maxLength={40}
          dir="ltr"
          aria-invalid={codeError || undefined}
          aria-describedby={`scan-code-hint${codeError ? " scan-code-error" : ""}`}
          className={`tabular min-h-12 rounded-lg border-2 bg-paper-raised px-3 text-xl tracking-wider text-ink ${codeError ? "border-level-emergency" : "border-stone-line"}`}
          data-testid="scan-code"
        />
        <FieldError id="scan-code-error" errors={codeError ? [t("codeInvalid")] : undefined} className="text-base" />
        <button type="submit" className={buttonClass("primary", "self-start")} data-testid="scan-code-submit">
          {t("codeSubmit")}
        </button>
      </form>
    </div>
  );
}
