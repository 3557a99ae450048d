"use client";
import { useMutation } from "@tanstack/react-query";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { apiFetch } from "@/lib/browser/api-client";
import { useRouter } from "@/lib/i18n/navigation";

/** "I changed my leg bag / valve today": stores the date; the page then shows the next change. */
export function BagChangeButtons({ patientId }: { patientId: string }) {
  const t = useTranslations("Today.bags");
  const router = useRouter();
  const [saved, setSaved] = useState<"leg-bag" | "valve" | null>(null);
  const mutation = useMutation({
    mutationFn: async (kind: "leg-bag" | "valve") => {
      await apiFetch("/api/bag-changes", { method: "POST", body: { patientId, kind } });
      return kind;
    },
    onSuccess: (kind) => {
      setSaved(kind);
      router.refresh();
    },
  });
  return (
    <div className="flex flex-col gap-3">
      {(["leg-bag", "valve"] as const).map((kind) => (
        <button
          key={kind}
          type="button"
          disabled={mutation.isPending}
          onClick={() => mutation.mutate(kind)}
          className="flex min-h-14 w-full items-center justify-center rounded-lg border-2 border-brand bg-paper-raised px-4 py-2 text-center font-bold text-brand hover:bg-brand-soft disabled:opacity-70"
          data-testid={`changed-${kind}`}
        >
          {t(kind === "leg-bag" ? "changedLegBag" : "changedValve")}
        </button>
      ))}
      <p role="status" className="font-bold">
        {mutation.isError ? t("error") : saved ? t(saved === "leg-bag" ? "savedLegBag" : "savedValve") : ""}
      </p>
    </div>
  );
}
