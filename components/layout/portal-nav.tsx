"use client";
import { useTranslations } from "next-intl";
import { CupIcon, HeartChatIcon, MenuIcon, SunIcon } from "@/components/portal/nav-icons";
import { Link, usePathname } from "@/lib/i18n/navigation";

const items = [
  { href: "/today", key: "today", Icon: SunIcon, match: ["/today"] },
  { href: "/check-in", key: "checkIn", Icon: HeartChatIcon, match: ["/check-in"] },
  { href: "/diary", key: "diary", Icon: CupIcon, match: ["/diary"] },
  { href: "/more", key: "more", Icon: MenuIcon, match: ["/more", "/my-catheter", "/people", "/learn", "/help"] },
] as const;

/** The bottom bar: four large targets, the current one marked for screen readers too. */
export function PortalNav() {
  const t = useTranslations("Portal.nav");
  const pathname = usePathname();
  return (
    // With very large text (the phone's text size at 200 %, or the person's own largest step on
    // any phone: a media query's em does not follow it), the bar stops floating over the page and
    // becomes a block at its end, as many columns of at least 10 rem as fit (one on a phone: a
    // word such as Urdu "Drinks" in Nastaliq is wider than half of it); "Get help" stays in the
    // sticky header.
    <nav
      aria-label={t("label")}
      data-testid="portal-nav"
      className="fixed inset-x-0 bottom-0 z-10 border-t border-stone-faint bg-paper-raised pb-[env(safe-area-inset-bottom)] max-[22em]:static in-data-[text-size=3]:static"
    >
      <ul className="mx-auto flex max-w-xl max-[22em]:grid max-[22em]:grid-cols-[repeat(auto-fit,minmax(min(100%,10rem),1fr))] in-data-[text-size=3]:grid in-data-[text-size=3]:grid-cols-[repeat(auto-fit,minmax(min(100%,10rem),1fr))]">
        {items.map(({ href, key, Icon, match }) => {
          const current = match.some((m) => pathname === m || pathname.startsWith(`${m}/`));
          return (
            <li key={key} className="flex-1">
              <Link
                href={href}
                aria-current={current ? "page" : undefined}
                className={`flex min-h-16 flex-col items-center justify-center gap-0.5 px-1 py-1.5 text-center font-bold leading-tight [overflow-wrap:break-word] ${
                  current ? "bg-brand-soft text-brand-strong" : "text-brand"
                }`}
              >
                <Icon />
                <span>{t(key)}</span>
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
