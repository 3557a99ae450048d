"use client";
import { useTranslations } from "next-intl";
import { useSharedErrorText } from "@/components/ui/shared-error-text";
import { ApiError } from "@/lib/browser/api-client";

/**
 * Turns error codes (zod messages and server field errors are codes) into this form's words,
 * from the namespace's `errors` group; an unknown code falls back to `errors.generic`.
 */
export function useErrorText(namespace: "AdminOrganisations" | "AdminStaff" | "AdminSettings" | "AdminPatients" | "Account" | "AcceptInvite" | "PasswordReset" | "TwoFactor") {
  const t = useTranslations(namespace);
  const e = useTranslations("Errors");
  const range = useSharedErrorText();
  const one = (code: string): string => {
    const r = range(code);
    if (r) return r;
    const key = `errors.${code}`;
    if (t.has(key as never)) return t(key as never);
    if (e.has(code as never)) return e(code as never);
    return t("errors.generic" as never);
  };
  return {
    one,
    list: (codes?: string[] | { message?: string }) => {
      if (!codes) return undefined;
      if (Array.isArray(codes)) return codes.map(one);
      return codes.message ? [one(codes.message)] : undefined;
    },
    /** The message for a failed request: its code in Errors, else the form's generic one. */
    ofError: (error: unknown) => (error instanceof ApiError ? one(error.code) : one("generic")),
  };
}
