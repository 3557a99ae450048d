import type { Metadata } from "next";
import { getTranslations, setRequestLocale } from "next-intl/server";
import { AcceptInviteForm } from "@/components/auth/accept-invite-form";
import { Card } from "@/components/ui/card";
import { previewInvitation } from "@/lib/admin/staff";
import { Link } from "@/lib/i18n/navigation";

export async function generateMetadata(): Promise<Metadata> {
  const t = await getTranslations("AcceptInvite");
  // The token is in this page's address: never send it on in a Referer.
  return { title: t("title"), referrer: "no-referrer", robots: { index: false } };
}

export default async function AcceptInvitePage({ params }: { params: Promise<{ locale: string; token: string }> }) {
  const { locale, token } = await params;
  setRequestLocale(locale as "en");
  const t = await getTranslations("AcceptInvite");
  const roles = await getTranslations("Vocabulary.role");
  const invitation = await previewInvitation(token);
  if (!invitation) {
    return (
      <Card className="flex flex-col gap-4">
        <h1 className="text-3xl font-bold">{t("invalidTitle")}</h1>
        <p>{t("invalidBody")}</p>
        <Link href="/sign-in" className="font-bold text-brand underline underline-offset-4">
          {t("goToSignIn")}
        </Link>
      </Card>
    );
  }
  return (
    <Card className="flex flex-col gap-5">
      <div>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="mt-1">{t("intro", { role: roles(invitation.role), organisations: invitation.organisations.map((o) => o.name).join(", ") })}</p>
      </div>
      <AcceptInviteForm token={token} email={invitation.email} suggestedName={invitation.name ?? ""} />
    </Card>
  );
}
