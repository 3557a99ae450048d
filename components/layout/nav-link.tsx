"use client";
import type { ReactNode } from "react";
import { Link, usePathname } from "@/lib/i18n/navigation";

/** A navigation link that marks itself as the current page (or the section of it). */
export function NavLink({ href, className, activeClassName, children }: { href: string; className: string; activeClassName: string; children: ReactNode }) {
  const pathname = usePathname();
  const active = pathname === href || pathname.startsWith(`${href}/`);
  return (
    <Link href={href} aria-current={active ? "page" : undefined} className={`${className} ${active ? activeClassName : ""}`}>
      {children}
    </Link>
  );
}
