import { getTranslations } from "next-intl/server";
import { getFormat } from "@/lib/i18n/format";
import { Card } from "@/components/ui/card";
import { Notice } from "@/components/ui/notice";
import { accountsUnderAttack, attemptsOnUnknownAccounts, UNDER_ATTACK_ATTEMPTS } from "@/db/queries/sign-in-attempts";
import { requirePageRole } from "@/lib/auth/permissions";
import { ACCOUNT_LIMITS } from "@/lib/auth/sign-in-throttle";
import { TableHead } from "@/components/ui/table-head";

export async function generateMetadata() {
  const t = await getTranslations("AdminSignIns");
  return { title: t("title") };
}

/** Accounts someone is trying to get into (lib/auth/sign-in-throttle.ts), for the admin to act on. */
export default async function SignInAttemptsPage({ params }: { params: Promise<{ locale: string }> }) {
  const { locale } = await params;
  const viewer = await requirePageRole(locale, "admin");
  const t = await getTranslations("AdminSignIns");
  const v = await getTranslations("Vocabulary");
  const format = await getFormat();
  const [accounts, unknown] = await Promise.all([accountsUnderAttack({ organisationIds: viewer.organisationIds }), attemptsOnUnknownAccounts()]);
  const when = (d: Date) => format.dateTime(d, { weekday: "short", day: "numeric", month: "short", hour: "numeric", minute: "2-digit" });
  return (
    <div className="flex flex-col gap-6">
      <div>
        <h1 className="text-3xl font-bold">{t("title")}</h1>
        <p className="text-ink-soft">{t("intro", { count: UNDER_ATTACK_ATTEMPTS })}</p>
      </div>

      <section aria-labelledby="attacked-heading" className="flex flex-col gap-3">
        <h2 id="attacked-heading" className="text-xl font-bold">
          {t("listHeading", { count: accounts.length })}
        </h2>
        {accounts.length === 0 ? (
          <p className="text-ink-soft">{t("none")}</p>
        ) : (
          <div className="overflow-x-auto">
            <table className="w-full min-w-[48rem] border-collapse text-start">
              <TableHead dense columns={[t("account"), { label: t("failed"), end: true }, { label: t("held"), end: true }, { label: t("places"), end: true }, t("lastTry"), t("state")]} />
              <tbody>
                {accounts.map((a) => (
                  <tr key={a.userId} className="border-b border-stone-faint align-top" data-testid="attacked-account">
                    <td className="p-2">
                      <strong>{a.name}</strong>
                      <div className="break-all text-sm text-ink-soft">{a.email}</div>
                      <div className="text-sm text-ink-soft">{v(`role.${a.role}`)}</div>
                    </td>
                    <td className="tabular p-2 text-end">
                      {a.failedAttempts}
                      {a.secondStepFailures > 0 ? (
                        <div className="text-sm font-bold text-level-emergency-ink">{t("wrongCodes", { count: a.secondStepFailures })}</div>
                      ) : null}
                    </td>
                    <td className="tabular p-2 text-end">{a.heldAttempts}</td>
                    <td className="tabular p-2 text-end">{a.places}</td>
                    <td className="tabular p-2">
                      {when(a.lastAttemptAt)}
                      <div className="text-sm text-ink-soft">{t("since", { date: when(a.windowStartedAt) })}</div>
                    </td>
                    <td className="p-2">
                      {a.heldUntil ? <strong>{t("heldUntil", { time: when(a.heldUntil) })}</strong> : <span>{t("notHeld")}</span>}
                      <div className="text-sm text-ink-soft">{a.notifiedAt ? t("told", { date: when(a.notifiedAt) }) : t("notTold")}</div>
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
        {accounts.some((a) => a.secondStepFailures > 0) ? (
          <Notice tone="stop" title={t("passwordKnownTitle")}>
            <p>{t("passwordKnown")}</p>
          </Notice>
        ) : null}
      </section>

      <p>{t("unknownAccounts", { attempts: unknown.attempts, addresses: unknown.emailAddresses })}</p>

      <Card className="flex flex-col gap-2">
        <h2 className="text-xl font-bold">{t("howHeading")}</h2>
        <ul className="list-disc ps-6">
          <li>{t("howFree", { count: ACCOUNT_LIMITS.freeFailures })}</li>
          <li>{t("howDelay", { first: ACCOUNT_LIMITS.firstDelaySeconds, max: ACCOUNT_LIMITS.maxDelaySeconds / 60 })}</li>
          <li>{t("howDevice")}</li>
          <li>{t("howReset")}</li>
          <li>{t("howTold", { count: ACCOUNT_LIMITS.noticeAfterAttempts })}</li>
          <li>{t("howAddress")}</li>
        </ul>
      </Card>
    </div>
  );
}
