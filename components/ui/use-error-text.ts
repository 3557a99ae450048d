"use client";
// Error codes (zod messages and the server's codes are codes) in the reader's words, and the one
// way a form keeps what went wrong with its last submit.
import { useTranslations } from "next-intl";
import { useState } from "react";
import { get, type FieldErrors, type FieldValues, type UseFormSetError } from "react-hook-form";
import { isApiError, setServerFieldErrors, type ApiError } from "@/lib/browser/api-client";
import { PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from "@/lib/auth/password-rules";
import { parseRangeCode } from "@/lib/shared/numbers";
import type en from "@/messages/en.json";

type Namespace = keyof typeof en;

/**
 * `one(code)`: the namespace's `errors.<code>`, else the shared `Errors.<code>` (request codes,
 * password rules), else the namespace's `errors.generic`, else a general word.
 */
export function useErrorText(namespace: Namespace) {
  const t = useTranslations(namespace);
  const e = useTranslations("Errors");
  const values = { min: PASSWORD_MIN_LENGTH, max: PASSWORD_MAX_LENGTH };
  const one = (code: string, fallback: "invalid" | "internal" = "invalid"): string => {
    // A number outside its range names the range and its unit: "Enter a number between 5 and 30 ml".
    const range = parseRangeCode(code);
    if (range) return range.unit ? e("rangeUnit", { min: range.min, max: range.max, unit: e(`units.${range.unit}`) }) : e("range", { min: range.min, max: range.max });
    const key = `errors.${code}`;
    if (t.has(key as never)) return t(key as never);
    if (e.has(code as never)) return e(code as never, values as never);
    if (t.has("errors.generic" as never)) return t("errors.generic" as never);
    return e(fallback);
  };
  return {
    one,
    /** The words for a react-hook-form error (or a list of codes). */
    list: (error?: string[] | { message?: string }) => {
      if (!error) return undefined;
      if (Array.isArray(error)) return error.map((c) => one(c));
      return error.message ? [one(error.message)] : undefined;
    },
    /** The words for the error at a nested path ("items.0.quantity") of a form's errors. */
    at: <T extends FieldValues>(errors: FieldErrors<T>, path: string) => {
      const found = get(errors, path) as { message?: string } | undefined;
      return found ? [one(found.message ?? "invalid")] : undefined;
    },
    /** The message for a failed request: its code here or in Errors, else the form's generic one. */
    ofError: (error: unknown) => (isApiError(error) ? one(error.code, "internal") : one("internal", "internal")),
  };
}

/**
 * What went wrong with a form's last submit: `fail(error)` puts the server's field errors on the
 * fields and words the rest for the one alert box above the button (`message`). `special` words a
 * request failure this form knows better (a conflict, a dead link).
 */
export function useSubmitFailure<T extends FieldValues>(namespace: Namespace, setError?: UseFormSetError<T>) {
  const text = useErrorText(namespace);
  const [message, setMessage] = useState<string | null>(null);
  return {
    text,
    message,
    show: setMessage,
    clear: () => setMessage(null),
    fail: (error: unknown, special?: (e: ApiError) => string | null | undefined) => {
      if (setError) setServerFieldErrors(error, setError);
      setMessage((isApiError(error) ? special?.(error) : null) ?? text.ofError(error));
    },
  };
}
