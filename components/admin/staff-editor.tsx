"use client";
import { useTranslations } from "next-intl";
import { useState } from "react";
import { Button } from "@/components/ui/button";
import { Checkbox, ChoiceGroup } from "@/components/ui/choice";
import { SelectField } from "@/components/ui/field";
import { DoneStatus, ErrorAlert } from "@/components/ui/notice";
import { useSubmitFailure } from "@/components/ui/use-error-text";
import { apiFetch } from "@/lib/browser/api-client";
import { useRouter } from "@/lib/i18n/navigation";
import { staffRoles } from "@/lib/validations/staff";

type Org = { id: string; name: string };

/** Role and memberships of one member of staff, and deactivation (which signs them out everywhere at once). */
export function StaffEditor({
  member,
  organisations,
  isSelf,
}: {
  member: { id: string; name: string; role: "admin" | "clinician"; active: boolean; organisationIds: string[] };
  organisations: Org[];
  isSelf: boolean;
}) {
  const t = useTranslations("AdminStaff");
  const v = useTranslations("Vocabulary");
  const failure = useSubmitFailure("AdminStaff");
  const router = useRouter();
  const [role, setRole] = useState(member.role);
  const [orgIds, setOrgIds] = useState<string[]>(member.organisationIds);
  const [done, setDone] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function run(fn: () => Promise<unknown>, ok: string) {
    setBusy(true);
    setDone(null);
    failure.clear();
    try {
      await fn();
      setDone(ok);
      router.refresh();
    } catch (error) {
      failure.fail(error);
    } finally {
      setBusy(false);
    }
  }

  return (
    <div className="flex flex-col gap-6">
      <ErrorAlert message={failure.message} />
      <DoneStatus message={done} />
      <form
        className="flex max-w-xl flex-col gap-4"
        onSubmit={(e) => {
          e.preventDefault();
          void run(() => apiFetch(`/api/admin/staff/${member.id}`, { method: "PATCH", body: { role, organisationIds: orgIds } }), t("saved"));
        }}
      >
        <SelectField label={t("role")} value={role} onChange={(e) => setRole(e.target.value as typeof role)}>
          {staffRoles.map((r) => (
            <option key={r} value={r}>
              {v(`role.${r}`)}
            </option>
          ))}
        </SelectField>
        <ChoiceGroup legend={t("organisations")} hint={t("membershipsHint")}>
          {organisations.map((o) => (
            <Checkbox
              key={o.id}
              label={o.name}
              checked={orgIds.includes(o.id)}
              onChange={(e) => setOrgIds(e.target.checked ? [...orgIds, o.id] : orgIds.filter((id) => id !== o.id))}
            />
          ))}
        </ChoiceGroup>
        <div>
          <Button type="submit" disabled={busy}>
            {t("save")}
          </Button>
        </div>
      </form>
      <section aria-labelledby="access-heading" className="flex max-w-xl flex-col gap-3 border-t border-stone-faint pt-4">
        <h2 id="access-heading" className="text-xl font-bold">
          {t("accessHeading")}
        </h2>
        {member.active ? (
          <>
            <p>{t("deactivateExplain")}</p>
            {isSelf ? (
              <p className="text-ink-soft">{t("cannotDeactivateSelf")}</p>
            ) : (
              <div>
                <Button
                  variant="danger"
                  disabled={busy}
                  onClick={() => {
                    if (!window.confirm(t("deactivateConfirm", { name: member.name }))) return;
                    void run(() => apiFetch(`/api/admin/staff/${member.id}/deactivate`, { method: "POST", body: {} }), t("deactivated"));
                  }}
                >
                  {t("deactivate")}
                </Button>
              </div>
            )}
          </>
        ) : (
          <>
            <p>{t("inactiveExplain")}</p>
            <div>
              <Button
                variant="secondary"
                disabled={busy}
                onClick={() => void run(() => apiFetch(`/api/admin/staff/${member.id}/reactivate`, { method: "POST", body: {} }), t("reactivated"))}
              >
                {t("reactivate")}
              </Button>
            </div>
          </>
        )}
      </section>
    </div>
  );
}
