"use client";
import { useTranslations } from "next-intl";
import { useEffect, useMemo, useState } from "react";
import { ACCEPTED_PHOTO_TYPES, precheck, uploadFile } from "@/components/uploads/upload-file";

const TYPES: readonly string[] = ACCEPTED_PHOTO_TYPES;

type State = "idle" | "sending" | "sent" | "error" | "too-big" | "wrong-type";

/**
 * A photo for the nurse (e.g. the skin around a tummy catheter), through the same upload service
 * as the record's Documents tab (components/uploads/upload-file.ts): declared to the app, sent
 * to the store with a presigned PUT, then checked from its bytes on the server.
 */
export function SitePhotoUpload({ patientId }: { patientId: string }) {
  const t = useTranslations("MyCatheter.photo");
  const tu = useTranslations("Uploads");
  const [file, setFile] = useState<File | null>(null);
  const [state, setState] = useState<State>("idle");
  // A local preview of the chosen photo, let go when another is chosen or the page closes.
  const preview = useMemo(() => (file ? URL.createObjectURL(file) : null), [file]);
  useEffect(() => () => {
    if (preview) URL.revokeObjectURL(preview);
  }, [preview]);

  async function send() {
    if (!file) return;
    setState("sending");
    const outcome = await uploadFile({ patientId, file, category: "site-photo", label: tu("categories.site-photo") });
    if (outcome.ok) {
      setState("sent");
      setFile(null);
    } else {
      setState(outcome.reason === "failed" ? "error" : outcome.reason);
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
            const problem = f ? precheck(f, TYPES) : null;
            if (problem === "too-big" || problem === "wrong-type") return setState(problem);
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
