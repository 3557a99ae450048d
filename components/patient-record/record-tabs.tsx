"use client";
import { useTranslations } from "next-intl";
import { Link, usePathname } from "@/lib/i18n/navigation";

const tabs = [
  { key: "device", path: "" },
  { key: "history", path: "/history" },
  { key: "careTeam", path: "/care-team" },
  { key: "passport", path: "/passport" },
  { key: "documents", path: "/documents" },
  { key: "checkIns", path: "/check-ins" },
  { key: "letters", path: "/letters" },
  { key: "access", path: "/access" },
] as const;

/** The tabs of a patient's record; the current one carries aria-current="page". */
export function RecordTabs({ patientId }: { patientId: string }) {
  const t = useTranslations("PatientRecord.tabs");
  const pathname = usePathname();
  const base = `/patients/${patientId}`;
  return (
    <nav aria-label={t("label")} className="-mx-1 overflow-x-auto border-b-2 border-stone-faint">
      <ul className="flex min-w-max gap-1 px-1">
        {tabs.map((tab) => {
          const href = `${base}${tab.path}`;
          const active = tab.path === "" ? pathname === base : pathname === href || pathname.startsWith(`${href}/`);
          return (
            <li key={tab.key}>
              <Link
                href={href}
                aria-current={active ? "page" : undefined}
                className={`-mb-0.5 inline-flex min-h-12 items-center border-b-4 px-3 font-bold ${
                  active ? "border-brand text-ink" : "border-transparent text-brand hover:border-stone-line"
                }`}
              >
                {t(tab.key)}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
