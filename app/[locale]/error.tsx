"use client";
import { useTranslations } from "next-intl";
import { Button } from "@/components/ui/button";

export default function ErrorPage({ reset }: { error: Error; reset: () => void }) {
  const t = useTranslations("Errors");
  return (
    <main className="mx-auto flex min-h-dvh max-w-md flex-col justify-center gap-4 p-6">
      <h1 className="text-3xl font-bold">{t("errorTitle")}</h1>
      <p>{t("errorBody")}</p>
      <Button onClick={reset}>{t("retry")}</Button>
    </main>
  );
}
