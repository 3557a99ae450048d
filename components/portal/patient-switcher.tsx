import { useTranslations } from "next-intl";
import type { PortalPatient } from "@/lib/portal";
import { Link } from "@/lib/i18n/navigation";

/** For a carer who helps more than one person: whose page this is. */
export function PatientSwitcher({ patients, currentId, path }: { patients: PortalPatient[]; currentId: string; path: string }) {
  const t = useTranslations("Portal");
  if (patients.length < 2) return null;
  return (
    <nav aria-label={t("switchPatient")} className="flex flex-wrap gap-2">
      {patients.map((p) => (
        <Link
          key={p.id}
          href={{ pathname: path, query: { patient: p.id } }}
          aria-current={p.id === currentId ? "page" : undefined}
          className={`flex min-h-12 items-center rounded-lg border-2 px-4 font-bold ${p.id === currentId ? "border-brand bg-brand text-white" : "border-brand text-brand"}`}
        >
          {p.givenName} {p.familyName}
        </Link>
      ))}
    </nav>
  );
}
