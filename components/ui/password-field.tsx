"use client";
// The one password box. A new password carries the rules as its hint (lib/auth/password-rules,
// checked again by the server); its confirmation and a current password are only boxes. Pasting is always allowed, so a
// password manager works (WCAG 3.3.8).
import { useTranslations } from "next-intl";
import type { ComponentProps } from "react";
import { PASSWORD_MIN_LENGTH } from "@/lib/auth/password-rules";
import { Field, type FieldProps } from "./field";

export function PasswordField({ purpose, hint, ...props }: FieldProps & { purpose: "new" | "confirm" | "current" } & Omit<ComponentProps<"input">, "type">) {
  const t = useTranslations("Password");
  return (
    <Field
      type="password"
      autoComplete={purpose === "current" ? "current-password" : "new-password"}
      spellCheck={false}
      autoCapitalize="none"
      hint={hint ?? (purpose === "new" ? t("hint", { min: PASSWORD_MIN_LENGTH }) : undefined)}
      {...props}
    />
  );
}
