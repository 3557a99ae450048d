"use client";
import type { ReactNode } from "react";
import { Link, usePathname } from "@/lib/i18n/navigation";

/** A navigation link that marks the page you are on (aria-current), for sighted and screen-reader users alike. */
export function NavLink({ href, className, currentClassName = "", exact = false, children }: {
  href: string;
  className: string;
  currentClassName?: string;
  exact?: boolean;
  children: ReactNode;
}) {
  const pathname = usePathname();
  const current = exact ? pathname === href : pathname === href || pathname.startsWith(`${href}/`);
  return (
    <Link href={href} aria-current={current ? "page" : undefined} className={`${className} ${current ? currentClassName : ""}`}>
      {children}
    </Link>
  );
}
