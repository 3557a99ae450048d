"use client";
import { useLocale, useTranslations } from "next-intl";
import { useFormat } from "@/components/i18n/format";
import type { FluidBalance } from "@/lib/clinical";
import { directionOf } from "@/lib/i18n/routing";

/**
 * Seven days of drinks in and urine out as paired bars. Bars differ by fill pattern as well as
 * colour, with a legend; the table under it carries the same numbers for screen readers and
 * for anyone who prefers figures. Right to left, the days run from the right, in the table's
 * order as it is read (an SVG does not mirror itself).
 */
export function WeekChart({ days }: { days: FluidBalance[] }) {
  const t = useTranslations("Diary.week");
  const tu = useTranslations("Diary");
  const format = useFormat();
  const rtl = directionOf(useLocale()) === "rtl";
  const max = Math.max(1000, ...days.flatMap((d) => [d.inMl, d.outMl]));
  const w = 340;
  const h = 180;
  const top = 10;
  const base = h - 28;
  const slot = w / days.length;
  const bar = Math.min(16, slot / 3);
  const y = (ml: number) => base - ((base - top) * ml) / max;
  const label = (d: string) => format.dateTime(new Date(`${d}T12:00:00Z`), { weekday: "short", timeZone: "UTC" });
  const longLabel = (d: string) => format.dateTime(new Date(`${d}T12:00:00Z`), { weekday: "long", day: "numeric", month: "long", timeZone: "UTC" });
  const ml = (n: number) => tu("amount", { ml: format.number(n) });

  return (
    <figure className="flex flex-col gap-3">
      <svg viewBox={`0 0 ${w} ${h}`} className="h-auto w-full" role="img" aria-labelledby="week-title week-desc">
        <title id="week-title">{t("chartTitle")}</title>
        <desc id="week-desc">{t("chartDesc")}</desc>
        <defs>
          <pattern id="out-hatch" width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)">
            <rect width="6" height="6" fill="#fdf0d9" />
            <rect width="3" height="6" fill="#8a4b00" />
          </pattern>
        </defs>
        <line x1="0" x2={w} y1={base} y2={base} stroke="#5d6468" strokeWidth="1.5" />
        {days.map((d, i) => {
          const cx = slot * (rtl ? days.length - 1 - i : i) + slot / 2;
          // Drinks first, then urine, in reading order.
          const [inX, outX] = rtl ? [cx + 1, cx - bar - 1] : [cx - bar - 1, cx + 1];
          return (
            <g key={d.day} data-day={d.day}>
              <rect x={inX} y={y(d.inMl)} width={bar} height={base - y(d.inMl)} fill="#0b5563" />
              <rect x={outX} y={y(d.outMl)} width={bar} height={base - y(d.outMl)} fill="url(#out-hatch)" stroke="#8a4b00" strokeWidth="1" />
              <text x={cx} y={h - 8} textAnchor="middle" fontSize="13" fill="#1c1f21">
                {label(d.day)}
              </text>
            </g>
          );
        })}
      </svg>
      <figcaption className="flex flex-wrap gap-4" aria-hidden="true">
        <span className="flex items-center gap-2">
          <span className="inline-block h-5 w-5 bg-brand" /> {t("in")}
        </span>
        <span className="flex items-center gap-2">
          <svg viewBox="0 0 20 20" className="h-5 w-5">
            <rect width="20" height="20" fill="url(#out-hatch)" stroke="#8a4b00" />
          </svg>{" "}
          {t("out")}
        </span>
      </figcaption>
      {/* At the largest text in a narrow phone the three columns may not fit: the table then scrolls
          inside its own box (focusable, named), never the page. The box also holds the hidden caption. */}
      <div className="relative overflow-x-auto" tabIndex={0} role="region" aria-label={t("tableCaption")}>
      <table className="w-full border-collapse text-start tabular">
        <caption className="sr-only">{t("tableCaption")}</caption>
        <thead>
          <tr className="border-b-2 border-stone-line">
            <th scope="col" className="py-2 text-start">
              {t("day")}
            </th>
            <th scope="col" className="py-2 text-end">
              {t("in")}
            </th>
            <th scope="col" className="py-2 text-end">
              {t("out")}
            </th>
          </tr>
        </thead>
        <tbody>
          {days.map((d) => (
            <tr key={d.day} className="border-b border-stone-faint">
              <th scope="row" className="py-2 text-start font-normal">
                <span aria-hidden="true">{label(d.day)}</span>
                <span className="sr-only">{longLabel(d.day)}</span>
              </th>
              <td className="py-2 text-end">{ml(d.inMl)}</td>
              <td className="py-2 text-end">{ml(d.outMl)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      </div>
    </figure>
  );
}
