"use client";
// "Scan packaging": a field a USB scanner types into, and a camera reader. Both end in
// readScan (lib/gs1-input → lib/clinical parseGs1), which fills GTIN, lot, expiry and serial.
import { useTranslations } from "next-intl";
import { useEffect, useId, useLayoutEffect, useRef, useState, type KeyboardEvent } from "react";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/notice";
import { GS_VISIBLE, isGroupSeparatorKey, readCameraText, readScan, showScan, type CameraSymbology, type ScanReading } from "@/lib/browser/gs1-input";

export type ScanFill = { gtin?: string; lot?: string; expiry?: string; serial?: string; udi: string };

/** parseGs1's English messages → a translated key; the AI detail is kept as it is. */
function errorKey(message: string): { key: "gtinCheckDigit" | "dateInvalid" | "separator" | "nothing" | "unreadable" | "notGs1" | "digitalLink"; detail: string } {
  if (/^AI 01: check digit/.test(message)) return { key: "gtinCheckDigit", detail: message };
  if (/^not a GS1-128 label/.test(message)) return { key: "notGs1", detail: message };
  if (/^no GTIN \(01\) in the address|percent-encoding|belongs in the path/.test(message)) return { key: "digitalLink", detail: message };
  if (/^AI 1[1-7]: /.test(message)) return { key: "dateInvalid", detail: message };
  if (/group separator/.test(message)) return { key: "separator", detail: message };
  if (message === "nothing to read") return { key: "nothing", detail: message };
  return { key: "unreadable", detail: message };
}

export function ScanField({ today, onRead }: { today: string; onRead: (fill: ScanFill) => void }) {
  const t = useTranslations("EpisodeForm.scan");
  const id = useId();
  const [raw, setRaw] = useState("");
  const [reading, setReading] = useState<ScanReading | null>(null);
  const [cameraOpen, setCameraOpen] = useState(false);
  const inputRef = useRef<HTMLInputElement>(null);
  // Where the caret goes after a group separator is put in. Applied as soon as React has written
  // the new value, before the next key is handled: a scanner types faster than an animation
  // frame on a busy machine, and a caret moved later put the rest of the label in the wrong place.
  const caretAfter = useRef<number | null>(null);
  useLayoutEffect(() => {
    if (caretAfter.current === null || !inputRef.current) return;
    inputRef.current.setSelectionRange(caretAfter.current, caretAfter.current);
    caretAfter.current = null;
  }, [raw]);

  // Every reading replaces every field a label can carry: a field this label lacks is cleared,
  // never left from the label scanned before.
  const show = (r: ScanReading) => {
    setReading(r);
    onRead({ gtin: r.gtin, lot: r.lot, expiry: r.expiry, serial: r.serial, udi: r.normalised });
  };
  const read = (text: string) => {
    if (!text.trim()) return;
    show(readScan(text, today));
  };

  const onKeyDown = (e: KeyboardEvent<HTMLInputElement>) => {
    if (e.key === "Enter") {
      // A scanner ends with Enter: read the label, do not submit the form.
      e.preventDefault();
      read(raw);
      return;
    }
    if (isGroupSeparatorKey({ key: e.key, ctrlKey: e.ctrlKey, code: e.code, keyCode: e.keyCode })) {
      e.preventDefault();
      const el = e.currentTarget;
      const start = el.selectionStart ?? raw.length;
      const end = el.selectionEnd ?? raw.length;
      const next = raw.slice(0, start) + GS_VISIBLE + raw.slice(end);
      caretAfter.current = start + 1;
      setRaw(next);
    }
  };

  const filled = reading
    ? (["gtin", "lot", "expiry", "serial"] as const).filter((k) => reading[k] !== undefined)
    : [];
  const absent = reading ? (["gtin", "lot", "expiry", "serial"] as const).filter((k) => reading[k] === undefined) : [];

  return (
    <div className="flex flex-col gap-2 sm:col-span-2" data-testid="scan-field">
      <label htmlFor={id} className="font-bold">
        {t("label")}
      </label>
      <p id={`${id}-hint`} className="text-sm text-ink-soft">
        {t("hint", { gs: GS_VISIBLE })}
      </p>
      <div className="flex flex-col gap-2 sm:flex-row">
        <input
          id={id}
          ref={inputRef}
          value={raw}
          onChange={(e) => setRaw(showScan(e.target.value))}
          onKeyDown={onKeyDown}
          autoComplete="off"
          autoCapitalize="off"
          spellCheck={false}
          dir="ltr"
          aria-describedby={`${id}-hint ${id}-result`}
          className="tabular min-h-12 w-full rounded-lg border-2 border-stone-line bg-paper-raised px-3 font-mono text-ink"
          data-testid="scan-input"
        />
        <Button variant="secondary" className="shrink-0 whitespace-nowrap" onClick={() => read(raw)} data-testid="scan-read">
          {t("read")}
        </Button>
        <Button variant="secondary" className="shrink-0 whitespace-nowrap" onClick={() => setCameraOpen((o) => !o)} aria-expanded={cameraOpen} data-testid="camera-open">
          <CameraIcon />
          {cameraOpen ? t("cameraClose") : t("camera")}
        </Button>
      </div>
      {cameraOpen ? (
        <CameraReader
          onText={(text, symbology) => {
            setCameraOpen(false);
            setRaw(showScan(text));
            show(readCameraText(text, symbology, today));
          }}
        />
      ) : null}
      <div id={`${id}-result`} aria-live="polite">
        {reading && filled.length > 0 ? (
          <p className="font-bold text-level-selfcare-ink" data-testid="scan-filled">
            {t("filled", { fields: filled.map((k) => t(`field.${k}`)).join(", ") })}
          </p>
        ) : null}
        {reading && absent.length > 0 && absent.length < 4 ? (
          <p className="text-ink-soft" data-testid="scan-absent">
            {t("absent", { fields: absent.map((k) => t(`field.${k}`)).join(", ") })}
          </p>
        ) : null}
        {reading && reading.errors.length > 0 ? (
          <ErrorAlert message={t("errorsTitle")} testId="scan-errors" className="mt-1">
            <ul className="list-disc ps-6">
              {reading.errors.map((m) => {
                const { key, detail } = errorKey(m);
                return (
                  <li key={m}>
                    {t(`error.${key}`)} <span className="text-sm text-ink-soft" dir="ltr">({detail})</span>
                  </li>
                );
              })}
            </ul>
          </ErrorAlert>
        ) : null}
      </div>
    </div>
  );
}

function CameraIcon() {
  return (
    <svg viewBox="0 0 24 24" className="h-5 w-5" aria-hidden="true">
      <path fill="none" stroke="currentColor" strokeWidth="2" strokeLinejoin="round" d="M3 7h4l2-3h6l2 3h4v13H3z" />
      <circle cx="12" cy="13" r="4" fill="none" stroke="currentColor" strokeWidth="2" />
    </svg>
  );
}

type Controls = { stop: () => void };

/**
 * Reads a GS1 DataMatrix, GS1-128 or QR code from the camera. The decoder is loaded only when
 * the camera is opened, so no other page carries its weight.
 */
function CameraReader({ onText }: { onText: (text: string, symbology: CameraSymbology) => void }) {
  const t = useTranslations("EpisodeForm.scan");
  const videoRef = useRef<HTMLVideoElement>(null);
  const [status, setStatus] = useState<"starting" | "scanning" | "denied" | "none" | "insecure" | "failed">("starting");
  const done = useRef(false);

  useEffect(() => {
    let controls: Controls | null = null;
    let cancelled = false;
    (async () => {
      if (!navigator.mediaDevices?.getUserMedia) {
        setStatus("insecure");
        return;
      }
      try {
        const [{ BrowserMultiFormatReader }, { BarcodeFormat, DecodeHintType }] = await Promise.all([
          import("@zxing/browser"),
          import("@zxing/library"),
        ]);
        if (cancelled || !videoRef.current) return;
        const hints = new Map();
        hints.set(DecodeHintType.POSSIBLE_FORMATS, [BarcodeFormat.DATA_MATRIX, BarcodeFormat.CODE_128, BarcodeFormat.QR_CODE]);
        hints.set(DecodeHintType.TRY_HARDER, true);
        // Keep the FNC1 of a GS1-128: "]C1" first, ASCII 29 between fields (without this hint
        // the reader drops them and a lot runs into the serial after it).
        hints.set(DecodeHintType.ASSUME_GS1, true);
        const reader = new BrowserMultiFormatReader(hints, { delayBetweenScanAttempts: 150 });
        controls = await reader.decodeFromConstraints(
          { video: { facingMode: { ideal: "environment" } } },
          videoRef.current,
          (result, _error, c) => {
            if (result && !done.current) {
              done.current = true;
              c.stop();
              const format = result.getBarcodeFormat();
              const symbology: CameraSymbology =
                format === BarcodeFormat.CODE_128 ? "code128" : format === BarcodeFormat.DATA_MATRIX ? "datamatrix" : format === BarcodeFormat.QR_CODE ? "qr" : "other";
              onText(result.getText(), symbology);
            }
          },
        );
        if (cancelled) controls.stop();
        else setStatus("scanning");
      } catch (e) {
        const name = e instanceof Error ? e.name : "";
        setStatus(name === "NotAllowedError" ? "denied" : name === "NotFoundError" || name === "OverconstrainedError" ? "none" : "failed");
      }
    })();
    return () => {
      cancelled = true;
      controls?.stop();
    };
    // onText is recreated by the parent on each render; the reader must start only once.
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, []);

  return (
    <div className="flex flex-col gap-2 rounded-lg border-2 border-stone-line bg-paper-sunk p-3" data-testid="camera-reader">
      <video ref={videoRef} className="aspect-video w-full max-w-md rounded-lg bg-ink object-cover" muted playsInline />
      <p aria-live="polite" className={status === "scanning" || status === "starting" ? "text-ink-soft" : "font-bold text-level-emergency-ink"}>
        {t(`cameraStatus.${status}`)}
      </p>
    </div>
  );
}
