import { getTranslations, setRequestLocale } from "next-intl/server";
import { CarerInviteForm } from "@/components/auth/carer-invite-form";
import { Card } from "@/components/ui/card";
import { getViewer } from "@/lib/auth/session";
import { Link } from "@/lib/i18n/navigation";
import { viewCarerInvite } from "@/lib/portal/invitations";

// The token is the secret in this address: keep it out of Referer headers and caches.
export async function generateMetadata({ params }: { params: Promise<{ locale: "en" }> }) {
  const { locale } = await params;
  const t = await getTranslations({ locale, namespace: "CarerInvite" });
  return { title: t("title"), referrer: "no-referrer" as const };
}

export const dynamic = "force-dynamic";

export default async function CarerInvitePage({ params }: { params: Promise<{ locale: string; token: string }> }) {
  const { locale, token } = await params;
  setRequestLocale(locale as "en");
  const t = await getTranslations("CarerInvite");
  const view = await viewCarerInvite({ token, viewer: await getViewer() });
  return (
    <Card className="flex flex-col gap-5 text-body" data-testid={`carer-invite-${view.state}`}>
      <h1 className="text-3xl font-bold">{t("title")}</h1>
      {view.state === "invalid" ? (
        <>
          <p>{t("invalid")}</p>
          <Link href="/sign-in" className="flex min-h-12 items-center justify-center font-bold text-brand underline underline-offset-4">
            {t("toSignIn")}
          </Link>
        </>
      ) : (
        <>
          <p className="text-lg">{t("intro", { name: view.patientGivenName })}</p>
          {view.state === "wrong-account" ? (
            <>
              <p>{t("wrongAccount")}</p>
              <Link href="/sign-out" className="flex min-h-12 items-center justify-center font-bold text-brand underline underline-offset-4">
                {t("signOut")}
              </Link>
            </>
          ) : view.state === "not-carer" ? (
            <p>{t("notCarer")}</p>
          ) : (
            <>
              <p>{t(`explain.${view.state}`)}</p>
              <CarerInviteForm token={token} mode={view.state} email={"email" in view ? view.email : undefined} />
            </>
          )}
        </>
      )}
    </Card>
  );
}
