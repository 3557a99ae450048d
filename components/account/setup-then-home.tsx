"use client";
import { useLocale } from "next-intl";
import { TwoFactorSetup } from "./two-factor-setup";

export function SetupThenHome() {
  const locale = useLocale();
  return <TwoFactorSetup onDone={() => window.location.assign(`/${locale}/home`)} />;
}
