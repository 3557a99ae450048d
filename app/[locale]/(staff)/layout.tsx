import { setRequestLocale } from "next-intl/server";
import type { ReactNode } from "react";
import { ClientMessages } from "@/components/i18n/client-messages";
import { StaffShell } from "@/components/layout/staff-shell";
import { requirePageRole } from "@/lib/auth/permissions";
import { requestRegion } from "@/lib/i18n/format";

export default async function StaffLayout({ children, params }: { children: ReactNode; params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  setRequestLocale(locale as "en");
  const viewer = await requirePageRole(locale, "admin", "clinician");
  return (
    <ClientMessages scope="staff" region={await requestRegion()}>
      <StaffShell role={viewer.role} name={viewer.name}>
        {children}
      </StaffShell>
    </ClientMessages>
  );
}
