"use client";
// The record's photos and documents: add one (presigned upload, checked again from its bytes
// on the server), see them as thumbnails or file rows, download, remove with a confirmation.
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useTranslations } from "next-intl";
import { useFormat } from "@/components/i18n/format";
import { useEffect, useRef, useState } from "react";
import { useErrorText } from "@/components/ui/use-error-text";
import { Button, buttonClass } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Field, SelectField } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/notice";
import { apiFetch, isApiError } from "@/lib/browser/api-client";
import type { UploadDto } from "@/lib/shared/dto";
import { uploadCategories, uploadCreateSchema, type UploadCategory } from "@/lib/validations/upload";
import { ACCEPTED_UPLOAD_TYPES, precheck, uploadFile, type UploadFailure } from "./upload-file";

export const uploadKeys = {
  all: ["uploads"] as const,
  list: (patientId: string) => ["uploads", patientId] as const,
};

async function fetchUploads(patientId: string): Promise<UploadDto[]> {
  return (await apiFetch<{ uploads: UploadDto[] }>(`/api/patients/${patientId}/uploads`)).uploads;
}

const failureKey: Record<UploadFailure, "tooLarge" | "badType" | "failed"> = {
  "too-big": "tooLarge",
  "wrong-type": "badType",
  failed: "failed",
};

export function UploadsPanel({ patientId, initial, canRemove, readOnly = false }: { patientId: string; initial: UploadDto[]; canRemove: boolean; readOnly?: boolean }) {
  const t = useTranslations("Uploads");
  const tc = useTranslations("Common");
  const format = useFormat();
  const queryClient = useQueryClient();
  const list = useQuery({ queryKey: uploadKeys.list(patientId), queryFn: () => fetchUploads(patientId), initialData: initial });

  const [category, setCategory] = useState<UploadCategory>("packaging-label");
  const [label, setLabel] = useState("");
  const [file, setFile] = useState<File | null>(null);
  const [errors, setErrors] = useState<{ label?: string[]; file?: string[] }>({});
  const errorText = useErrorText("Uploads");
  const [status, setStatus] = useState<string>("");
  const [confirmId, setConfirmId] = useState<string | null>(null);
  // A new key clears the file input after an upload.
  const [fileKey, setFileKey] = useState(0);
  const confirmRef = useRef<HTMLButtonElement>(null);

  useEffect(() => {
    if (confirmId) confirmRef.current?.focus();
  }, [confirmId]);

  const upload = useMutation({
    mutationFn: (input: { file: File; category: UploadCategory; label: string }) => uploadFile({ patientId, ...input }),
    onSuccess: (outcome) => {
      if (outcome.ok) {
        setStatus(t("uploaded"));
        setFile(null);
        setLabel("");
        setFileKey((k) => k + 1);
      } else {
        setErrors({ file: [t(failureKey[outcome.reason])] });
        setStatus("");
      }
      queryClient.invalidateQueries({ queryKey: uploadKeys.list(patientId) });
    },
  });

  const remove = useMutation({
    mutationFn: async (uploadId: string) => {
      try {
        await apiFetch(`/api/patients/${patientId}/uploads/${uploadId}`, { method: "DELETE" });
      } catch (error) {
        // Already gone is what was asked for.
        if (!isApiError(error) || error.status !== 404) throw error;
      }
    },
    onSuccess: () => {
      setConfirmId(null);
      setStatus(t("removed"));
      queryClient.invalidateQueries({ queryKey: uploadKeys.list(patientId) });
    },
  });

  function submit(e: React.FormEvent) {
    e.preventDefault();
    setStatus("");
    // Every problem at once, not the first only.
    const next: typeof errors = {};
    const labelCheck = uploadCreateSchema.shape.label.safeParse(label);
    if (!label.trim()) next.label = [t("labelRequired")];
    else if (!labelCheck.success) next.label = [errorText.one(labelCheck.error.issues[0].message)];
    if (!file) next.file = [t("chooseFile")];
    else {
      const problem = precheck(file, ACCEPTED_UPLOAD_TYPES);
      if (problem) next.file = [t(failureKey[problem])];
    }
    setErrors(next);
    if (Object.keys(next).length || !file) return;
    upload.mutate({ file, category, label: label.trim() });
  }

  // Only files that arrived and passed the checks are on the record; refused or unfinished ones
  // (no file to show) are listed apart, so they never look like blank documents of the patient.
  const all = list.data ?? [];
  const uploads = all.filter((u) => u.status === "ready");
  const notKept = all.filter((u) => u.status !== "ready");
  const fileUrl = (u: UploadDto, inline = false) => `/api/patients/${patientId}/uploads/${u.id}/file${inline ? "?inline=1" : ""}`;

  return (
    <div className="flex flex-col gap-6">
      <section aria-labelledby="uploads-heading" className="flex flex-col gap-3">
        <h2 id="uploads-heading" className="text-2xl font-bold">
          {t("title")}
        </h2>
        <p className="max-w-prose">{t("intro")}</p>
      </section>

      {readOnly ? null : <Card>
        <form onSubmit={submit} noValidate className="flex max-w-xl flex-col gap-4" aria-labelledby="uploads-add">
          <h3 id="uploads-add" className="text-xl font-bold">
            {t("add")}
          </h3>
          <SelectField
            label={t("category")}
            value={category}
            onChange={(e) => setCategory(e.target.value as UploadCategory)}
            options={uploadCategories.map((c) => ({ value: c, label: t(`categories.${c}`) }))}
          />
          <Field
            label={t("label")}
            hint={t("labelHint")}
            value={label}
            maxLength={120}
            onChange={(e) => setLabel(e.target.value)}
            errors={errors.label}
            name="label"
          />
          <Field
            key={fileKey}
            type="file"
            label={t("file")}
            hint={t("fileHint")}
            accept={ACCEPTED_UPLOAD_TYPES.join(",")}
            errors={errors.file}
            name="file"
            className="[&_input]:py-2"
            onChange={(e) => {
              setErrors((x) => ({ ...x, file: undefined }));
              setFile(e.target.files?.[0] ?? null);
            }}
          />
          <div>
            <Button type="submit" disabled={upload.isPending} data-testid="upload-submit">
              {upload.isPending ? t("uploading") : t("upload")}
            </Button>
          </div>
        </form>
      </Card>}

      <p role="status" className="font-bold" data-testid="upload-status">
        {status}
      </p>

      <section aria-labelledby="uploads-list" className="flex flex-col gap-3">
        <h3 id="uploads-list" className="text-xl font-bold">
          {t("listTitle")}
        </h3>
        {uploads.length === 0 ? <p>{t("empty")}</p> : null}
        <ul className="grid grid-cols-1 gap-4 sm:grid-cols-2 lg:grid-cols-3" data-testid="upload-list">
          {uploads.map((u) => (
            <li key={u.id} className="flex flex-col gap-2 rounded-card border border-stone-faint bg-paper-raised p-4" data-testid="upload-item">
              {u.isImage ? (
                // eslint-disable-next-line @next/next/no-img-element -- served by our own route, checked from its bytes
                <img
                  src={fileUrl(u, true)}
                  alt={t("photoOf", { label: u.label })}
                  className="h-40 w-full rounded-lg bg-paper-sunk object-contain"
                  loading="lazy"
                />
              ) : (
                <div aria-hidden="true" className="flex h-40 items-center justify-center rounded-lg bg-paper-sunk text-3xl font-bold text-stone">
                  {u.contentType === "application/pdf" ? "PDF" : "—"}
                </div>
              )}
              <p className="font-bold">{u.label}</p>
              <p className="text-sm">
                {t(`categories.${u.category}`)}
                {u.sizeBytes ? (
                  <>
                    {" · "}
                    <span className="tabular">{t("sizeKb", { size: format.number(Math.max(1, Math.round(u.sizeBytes / 1024))) })}</span>
                  </>
                ) : null}
              </p>
              <p className="text-sm text-ink-soft">
                <span className="tabular">{t("added", { date: format.dateTime(new Date(u.createdAt), { dateStyle: "medium", timeStyle: "short" }) })}</span>
                {u.uploadedByName ? <> {t("addedBy", { name: u.uploadedByName })}</> : null}
              </p>
              <div className="mt-auto flex flex-wrap gap-2">
                <a href={fileUrl(u)} className={buttonClass("secondary")} download>
                  {t("download")}
                </a>
                {canRemove ? (
                  <Button variant="quiet" onClick={() => setConfirmId(u.id)} disabled={remove.isPending} data-testid="upload-remove">
                    {t("remove")}
                  </Button>
                ) : null}
              </div>
              {confirmId === u.id ? (
                <div role="alertdialog" aria-labelledby={`rm-${u.id}`} className="flex flex-col gap-2 rounded-lg border-2 border-level-urgent bg-level-urgent-soft p-3">
                  <p id={`rm-${u.id}`} className="font-bold text-level-urgent-ink">
                    {t("removeConfirm", { label: u.label })}
                  </p>
                  <div className="flex flex-wrap gap-2">
                    <button
                      type="button"
                      ref={confirmRef}
                      className={buttonClass("danger")}
                      onClick={() => remove.mutate(u.id)}
                      disabled={remove.isPending}
                      data-testid="upload-remove-confirm"
                    >
                      {t("removeYes")}
                    </button>
                    <Button variant="secondary" onClick={() => setConfirmId(null)}>
                      {tc("cancel")}
                    </Button>
                  </div>
                </div>
              ) : null}
            </li>
          ))}
        </ul>
        {remove.isError ? <ErrorAlert message={t("removeFailed")} testId="upload-remove-error" /> : null}
      </section>

      {notKept.length ? (
        <details className="rounded-card border border-stone-faint bg-paper-sunk p-4" data-testid="uploads-not-kept">
          <summary className="cursor-pointer font-bold">{t("notKeptTitle", { count: notKept.length })}</summary>
          <p className="mt-2 text-sm text-ink-soft">{t("notKeptIntro")}</p>
          <ul className="mt-2 flex flex-col gap-2">
            {notKept.map((u) => (
              <li key={u.id} className="flex flex-wrap items-baseline gap-x-3 gap-y-1" data-testid="upload-not-kept">
                <span className="font-bold">{u.label}</span>
                <span className="text-sm font-bold text-level-urgent-ink">{u.status === "rejected" ? t("rejected") : t("pending")}</span>
                <span className="tabular text-sm text-ink-soft">
                  {t("added", { date: format.dateTime(new Date(u.createdAt), { dateStyle: "medium", timeStyle: "short" }) })}
                  {u.uploadedByName ? <> {t("addedBy", { name: u.uploadedByName })}</> : null}
                </span>
              </li>
            ))}
          </ul>
        </details>
      ) : null}
    </div>
  );
}
