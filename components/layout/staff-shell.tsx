import { getTranslations } from "next-intl/server";
import type { ReactNode } from "react";
import { Wordmark } from "@/components/ui/logo";
import type { Role } from "@/lib/auth/session";
import { LanguageSwitcher } from "./language-switcher";
import { NavLink } from "./nav-link";

/** `sub` items show under their section in the side navigation only; the phone bar keeps the top level. */
type Item = { href: string; label: string; sub?: boolean; exact?: boolean };

/** Staff pages: a left navigation on wide screens, a bottom bar on phones. */
export async function StaffShell({ role, name, children }: { role: Role; name: string; children: ReactNode }) {
  const t = await getTranslations("Nav");
  const a = await getTranslations("AdminNav");
  const tScan = await getTranslations("Scan");
  // Clinicians: the caseload and registering a patient (a "Scan" item joins them here).
  const items: Item[] =
    role === "admin"
      ? [
          { href: "/admin", label: t("admin"), exact: true },
          { href: "/admin/organisations", label: a("organisations"), sub: true },
          { href: "/admin/staff", label: a("staff"), sub: true },
          { href: "/admin/settings", label: a("settings"), sub: true },
          { href: "/admin/audit", label: a("audit"), sub: true },
          { href: "/admin/patients", label: a("patients"), sub: true },
          { href: "/admin/sign-ins", label: a("signIns"), sub: true },
        ]
      : [
          { href: "/caseload", label: t("caseload") },
          { href: "/patients/new", label: t("registerPatient") },
          { href: "/scan", label: tScan("nav") },
        ];
  items.push({ href: "/account", label: a("account") });
  items.push({ href: "/sign-out", label: t("signOut") });
  return (
    <div className="min-h-dvh text-staff md:flex">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:start-2 focus:top-2 focus:bg-paper-raised focus:p-2">
        {t("skip")}
      </a>
      <aside className="hidden w-60 shrink-0 flex-col gap-6 border-e border-stone-faint bg-paper-sunk p-5 md:flex">
        <Wordmark size="md" />
        <nav aria-label={t("label")} className="flex flex-col gap-1">
          {items.map((i) => (
            <NavLink
              key={i.href}
              href={i.href}
              exact={i.exact}
              className={`rounded-lg px-3 py-2 text-brand hover:bg-brand-soft ${i.sub ? "ms-4" : "font-bold"}`}
              activeClassName="bg-brand-soft underline underline-offset-4"
            >
              {i.label}
            </NavLink>
          ))}
        </nav>
        <div className="mt-auto flex flex-col gap-3 text-sm">
          <p className="text-ink-soft">{t("signedInAs", { name })}</p>
          <LanguageSwitcher />
        </div>
      </aside>
      <div className="flex min-w-0 flex-1 flex-col pb-20 md:pb-0">
        <header className="flex items-center justify-between gap-3 border-b border-stone-faint px-4 py-3 md:hidden">
          <Wordmark size="sm" />
          <LanguageSwitcher />
        </header>
        <main id="main" className="mx-auto w-full max-w-6xl flex-1 p-4 md:p-8">
          {children}
        </main>
      </div>
      <nav
        aria-label={t("label")}
        className="fixed inset-x-0 bottom-0 flex border-t border-stone-faint bg-paper-raised md:hidden"
      >
        {items.filter((i) => !i.sub).map((i) => (
          <NavLink
            key={i.href}
            href={i.href}
            exact={i.exact}
            className="flex min-h-14 flex-1 items-center justify-center px-1 text-center text-sm font-bold leading-tight text-brand"
            activeClassName="bg-brand-soft"
          >
            {i.label}
          </NavLink>
        ))}
      </nav>
    </div>
  );
}
