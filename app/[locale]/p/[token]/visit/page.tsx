import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { getTranslations, setRequestLocale } from "next-intl/server";
import { SignInForm } from "@/components/auth/sign-in-form";
import { buttonClass } from "@/components/ui/button";
import { VisitAccessForm } from "@/components/visit-access/visit-access-form";
import { findPatientAccess } from "@/db/queries/access";
import { cardRequest } from "@/lib/qr/card-page";
import { findPassport } from "@/lib/qr/device-card";

type Params = { locale: string; token: string };

export async function generateMetadata({ params }: { params: Promise<Params> }) {
  const { locale } = await params;
  const t = await getTranslations({ locale: locale as "en", namespace: "VisitAccess" });
  return { title: t("title"), robots: { index: false, follow: false } };
}

// "Clinician? Sign in for the full record": sign in here (and come back), state a reason, and
// the record opens for 24 hours. The grant itself is POST /api/visit-access.
export default async function VisitAccessPage({ params }: { params: Promise<Params> }) {
  const { locale, token: raw } = await params;
  setRequestLocale(locale as "en");
  const token = decodeURIComponent(raw);
  const t = await getTranslations("VisitAccess");
  const { viewer } = await cardRequest(await headers());
  const heading = <h1 className="text-3xl font-bold">{t("title")}</h1>;
  if (!viewer) {
    return (
      <div className="flex flex-col gap-5">
        {heading}
        <p>{t("signInFirst")}</p>
        <SignInForm returnTo={`/${locale}/p/${encodeURIComponent(token)}/visit`} />
      </div>
    );
  }
  if (viewer.role !== "clinician") {
    return (
      <div className="flex flex-col gap-5" data-testid="visit-not-clinician">
        {heading}
        <p>{t("notClinician")}</p>
      </div>
    );
  }
  const passport = await findPassport(token);
  // The card's own address says "no longer valid" (one place for that answer).
  if (!passport) redirect(`/${locale}/p/${encodeURIComponent(token)}`);
  const via = await findPatientAccess({ userId: viewer.userId, role: viewer.role, patientId: passport.patientId });
  if (via) {
    return (
      <div className="flex flex-col gap-5">
        {heading}
        <p>{via === "care_team" ? t("alreadyCareTeam") : t("alreadyVisit")}</p>
        <a href={`/${locale}/patients/${passport.patientId}`} className={buttonClass("primary")} data-testid="visit-open-record">
          {t("openRecord")}
        </a>
      </div>
    );
  }
  return (
    <div className="flex flex-col gap-5">
      {heading}
      <p>{t("intro", { name: viewer.name })}</p>
      <VisitAccessForm token={token} />
    </div>
  );
}
