"use client";
import { useTranslations } from "next-intl";
import { useEffect, useState } from "react";

const MAX_BYTES = 10 * 1024 * 1024;
const TYPES = ["image/jpeg", "image/png", "image/webp", "image/heic"];

type State = "idle" | "sending" | "sent" | "not-ready" | "error" | "too-big" | "wrong-type";

/**
 * A photo for the nurse (e.g. the skin around a tummy catheter), through the same upload service
 * as the clinician side. Built against the API expected from branch helper/passport:
 *   POST /api/patients/:id/uploads { category, fileName, contentType, sizeBytes }
 *     → { upload: { id }, url, method?, headers? }   (a presigned S3 PUT)
 *   PUT url (the file) → POST /api/patients/:id/uploads/:uploadId/complete
 * The lead adjusts the three calls below if the merged service differs.
 */
export function SitePhotoUpload({ patientId }: { patientId: string }) {
  const t = useTranslations("MyCatheter.photo");
  const [file, setFile] = useState<File | null>(null);
  const [preview, setPreview] = useState<string | null>(null);
  const [state, setState] = useState<State>("idle");

  useEffect(() => {
    if (!file) return setPreview(null);
    const url = URL.createObjectURL(file);
    setPreview(url);
    return () => URL.revokeObjectURL(url);
  }, [file]);

  async function send() {
    if (!file) return;
    setState("sending");
    try {
      const start = await fetch(`/api/patients/${patientId}/uploads`, {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify({ category: "site-photo", fileName: file.name || "photo", contentType: file.type, sizeBytes: file.size }),
      });
      if (start.status === 404 || start.status === 405) return setState("not-ready");
      if (!start.ok) return setState("error");
      const body = await start.json();
      const put = await fetch(body.url, { method: body.method ?? "PUT", headers: { "content-type": file.type, ...(body.headers ?? {}) }, body: file });
      if (!put.ok) return setState("error");
      const done = await fetch(`/api/patients/${patientId}/uploads/${body.upload?.id ?? body.id}/complete`, { method: "POST", headers: { "content-type": "application/json" }, body: "{}" });
      setState(done.ok ? "sent" : "error");
      if (done.ok) setFile(null);
    } catch {
      setState("error");
    }
  }

  return (
    <section aria-labelledby="photo-title" className="flex flex-col gap-3 rounded-card border border-stone-faint bg-paper-raised p-5">
      <h2 id="photo-title" className="text-2xl font-bold">
        {t("title")}
      </h2>
      <p>{t("intro")}</p>
      <label className="flex min-h-14 cursor-pointer items-center justify-center rounded-lg border-2 border-brand px-4 text-center font-bold text-brand focus-within:outline focus-within:outline-3 focus-within:outline-focus">
        <span>{file ? t("choose-again") : t("choose")}</span>
        <input
          type="file"
          accept={TYPES.join(",")}
          capture="environment"
          className="sr-only"
          onChange={(e) => {
            const f = e.target.files?.[0] ?? null;
            setState("idle");
            if (f && f.size > MAX_BYTES) return setState("too-big");
            if (f && !TYPES.includes(f.type)) return setState("wrong-type");
            setFile(f);
          }}
        />
      </label>
      {preview ? (
        // eslint-disable-next-line @next/next/no-img-element -- a local blob preview, never sent anywhere but the upload
        <img src={preview} alt={t("previewAlt")} className="max-h-64 w-full rounded-lg object-contain" />
      ) : null}
      {file ? (
        <button type="button" disabled={state === "sending"} onClick={send} className="flex min-h-14 items-center justify-center rounded-lg bg-brand px-4 text-lg font-bold text-white">
          {state === "sending" ? t("sending") : t("send")}
        </button>
      ) : null}
      <p role="status" className="font-bold">
        {state === "idle" || state === "sending" ? "" : t(`state.${state}`)}
      </p>
      <p className="text-ink-soft">{t("notUrgent")}</p>
    </section>
  );
}
