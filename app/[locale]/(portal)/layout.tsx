import { setRequestLocale } from "next-intl/server";
import type { ReactNode } from "react";
import { ClientMessages } from "@/components/i18n/client-messages";
import { PortalShell } from "@/components/layout/portal-shell";
import { requirePageRole } from "@/lib/auth/permissions";
import { requestRegion } from "@/lib/i18n/format";
import { getReadingComfort } from "@/db/queries/reading";

export default async function PortalLayout({ children, params }: { children: ReactNode; params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  setRequestLocale(locale as "en");
  const viewer = await requirePageRole(locale, "patient", "carer");
  const reading = await getReadingComfort({ userId: viewer.userId });
  return (
    <ClientMessages scope="portal" region={await requestRegion()}>
      <PortalShell reading={reading}>{children}</PortalShell>
    </ClientMessages>
  );
}
