"use client";
import { useLocale, useTranslations } from "next-intl";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { authClient } from "@/lib/auth/client";

export function SignOutButton({ className = "w-full" }: { className?: string }) {
  const t = useTranslations("SignOut");
  const locale = useLocale();
  const [busy, setBusy] = useState(false);
  return (
    <Button
      className={className}
      disabled={busy}
      onClick={async () => {
        setBusy(true);
        await authClient.signOut();
        // Nothing of the person's data stays in the browser after sign-out (ASVS 14.3.3).
        try {
          localStorage.clear();
          sessionStorage.clear();
        } catch {
          /* storage may be unavailable */
        }
        window.location.assign(`/${locale}/sign-in`);
      }}
    >
      {t("submit")}
    </Button>
  );
}
