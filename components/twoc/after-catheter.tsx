// The portal after the catheter came out (a trial under way or passed, or a removal): what is
// normal, what to do, and when to get help the same day, with the care team's and emergency
// numbers from settings and the lead team (getHelpContacts). General information.
import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import { CallButtons, type Contacts } from "@/components/portal/call-buttons";
import { Card } from "@/components/ui/card";
import type { LastRemoval } from "@/db/queries/episodes";

export async function AfterCatheter({ removal, contacts }: { removal: LastRemoval; contacts: Contacts }) {
  const t = await getTranslations("Twoc.after");
  const format = await getFormat();
  const when = format.dateTime(new Date(removal.removedAt), { weekday: "long", day: "numeric", month: "long", hour: "numeric", minute: "2-digit" });
  return (
    <Card className="flex flex-col gap-3" data-testid="after-catheter">
      <h2 className="text-xl font-bold">{t("title")}</h2>
      <p className="text-lg">{removal.trial === "under-way" ? t("removedTrial", { when }) : t("removed", { when })}</p>
      <ul className="flex list-disc flex-col gap-2 ps-6 text-lg">
        <li>{t("drink")}</li>
        <li>{t("pass")}</li>
        <li>{t("normal")}</li>
      </ul>
      <div className="rounded-lg border-4 border-level-emergency bg-level-emergency-soft p-3 text-level-emergency-ink">
        <p className="text-lg font-bold">{t("helpTitle")}</p>
        <ul className="flex list-disc flex-col gap-1 ps-6 text-lg">
          <li>{t("helpRetention")}</li>
          <li>{t("helpPain")}</li>
          <li>{t("helpFever")}</li>
        </ul>
      </div>
      <CallButtons contacts={contacts} emergencyFirst={false} />
      <p className="text-ink-soft">{t("general")}</p>
    </Card>
  );
}
