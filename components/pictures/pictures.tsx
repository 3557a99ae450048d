// Caddis's own drawings (docs/design.md, visual style): plain line pictures in the brand colour
// on paper, one idea each, a tick or a cross where right and wrong are shown. Each has its text
// alternative from the Pictures catalogue, given by <Picture>. Drawn for Caddis, copied from no
// product or leaflet.
import type { ReactNode } from "react";

const BRAND = "#0b5563";
const INK = "#1c1f21";
const SKIN = "#f1ece1";
const LINE = "#8c8678";
const GOOD = "#2f6b2f";
const BAD = "#a4231b";
const URINE = "#e8c547";

export const PICTURE_KEYS = ["bagBelowBladder", "legBag", "nightBag", "kinkedTube", "legStrap", "valve", "drinking", "urineColours"] as const;
export type PictureKey = (typeof PICTURE_KEYS)[number];

function Tick({ x, y }: { x: number; y: number }) {
  return (
    <g transform={`translate(${x} ${y})`}>
      <circle r="14" fill={GOOD} />
      <path d="M-7 0l5 5 9-10" stroke="#fff" strokeWidth="3.5" fill="none" strokeLinecap="round" strokeLinejoin="round" />
    </g>
  );
}

function Cross({ x, y }: { x: number; y: number }) {
  return (
    <g transform={`translate(${x} ${y})`}>
      <circle r="14" fill={BAD} />
      <path d="M-6 -6l12 12M6 -6l-12 12" stroke="#fff" strokeWidth="3.5" strokeLinecap="round" />
    </g>
  );
}

/** A bag with urine in it, its top at (x, y). */
function Bag({ x, y, w = 34, h = 52, fill = 0.55 }: { x: number; y: number; w?: number; h?: number; fill?: number }) {
  return (
    <g>
      <rect x={x} y={y + h * (1 - fill)} width={w} height={h * fill} rx="6" fill={URINE} opacity="0.85" />
      <rect x={x} y={y} width={w} height={h} rx="8" fill="none" stroke={BRAND} strokeWidth="3" />
      <path d={`M${x + w / 2} ${y + h} v8`} stroke={BRAND} strokeWidth="3" strokeLinecap="round" />
    </g>
  );
}

const drawings: Record<PictureKey, ReactNode> = {
  bagBelowBladder: (
    <>
      <path d="M70 30c-26 0-38 22-38 50v60h76V80c0-28-12-50-38-50z" fill={SKIN} stroke={LINE} strokeWidth="2.5" />
      <path d="M46 140l-6 120M94 140l6 120" stroke={LINE} strokeWidth="2.5" fill="none" />
      <ellipse cx="70" cy="118" rx="16" ry="12" fill={URINE} stroke={BRAND} strokeWidth="3" />
      <path d="M70 130c0 30 40 40 70 60" stroke={BRAND} strokeWidth="4" fill="none" strokeLinecap="round" />
      <Bag x={128} y={190} />
      <path d="M190 110v90" stroke={INK} strokeWidth="3" strokeDasharray="6 6" />
      <path d="M182 190l8 14 8-14" fill={INK} />
      <Tick x={200} y={60} />
    </>
  ),
  legBag: (
    <>
      <path d="M80 20c-6 60-4 120 0 240M130 20c4 60 6 120 2 240" stroke={LINE} strokeWidth="2.5" fill={SKIN} />
      <path d="M105 20v70" stroke={BRAND} strokeWidth="4" strokeLinecap="round" />
      <Bag x={88} y={110} w={36} h={80} fill={0.45} />
      <rect x="78" y="120" width="56" height="8" rx="3" fill={BRAND} opacity="0.35" />
      <rect x="78" y="170" width="56" height="8" rx="3" fill={BRAND} opacity="0.35" />
      <Tick x={190} y={60} />
    </>
  ),
  nightBag: (
    <>
      <rect x="10" y="70" width="150" height="40" rx="6" fill={SKIN} stroke={LINE} strokeWidth="2.5" />
      <path d="M20 110v60M150 110v60" stroke={LINE} strokeWidth="2.5" />
      <path d="M130 90c40 0 50 40 52 80" stroke={BRAND} strokeWidth="4" fill="none" strokeLinecap="round" />
      <path d="M165 170h40M185 170v90M170 260h30" stroke={INK} strokeWidth="3" />
      <Bag x={166} y={176} w={38} h={64} fill={0.4} />
      <Tick x={40} y={30} />
    </>
  ),
  kinkedTube: (
    <>
      <path d="M20 70h60c20 0 20-30 0-30s-20 30 0 30h140" stroke={BRAND} strokeWidth="6" fill="none" strokeLinecap="round" />
      <Cross x={232} y={40} />
      <path d="M20 190c60 0 120 10 200 10" stroke={BRAND} strokeWidth="6" fill="none" strokeLinecap="round" />
      <Tick x={232} y={160} />
    </>
  ),
  legStrap: (
    <>
      <path d="M80 20c-8 80-6 160 0 240M150 20c6 80 8 160 2 240" stroke={LINE} strokeWidth="2.5" fill={SKIN} />
      <path d="M115 20c0 40 -6 60 -6 100s6 60 6 120" stroke={BRAND} strokeWidth="4" fill="none" strokeLinecap="round" />
      <rect x="76" y="96" width="80" height="16" rx="5" fill="none" stroke={INK} strokeWidth="3" />
      <rect x="100" y="92" width="18" height="24" rx="3" fill={BRAND} />
      <Tick x={200} y={60} />
    </>
  ),
  valve: (
    <>
      <path d="M20 140h120" stroke={BRAND} strokeWidth="8" strokeLinecap="round" />
      <rect x="140" y="122" width="50" height="36" rx="8" fill="#fff" stroke={INK} strokeWidth="3" />
      <path d="M165 122v-34" stroke={INK} strokeWidth="6" strokeLinecap="round" />
      <circle cx="165" cy="84" r="8" fill={BRAND} />
      <path d="M190 140h24" stroke={INK} strokeWidth="6" strokeLinecap="round" />
      <path d="M220 150c4 10 4 20 0 30M232 150c4 12 4 26 0 40" stroke={URINE} strokeWidth="4" fill="none" strokeLinecap="round" />
    </>
  ),
  drinking: (
    <>
      {[0, 1, 2, 3, 4, 5].map((i) => (
        <g key={i} transform={`translate(${14 + i * 40} 110)`}>
          <path d="M0 0h28l-4 60H4z" fill="#dcebec" stroke={BRAND} strokeWidth="3" strokeLinejoin="round" />
          <path d="M2 18h24" stroke={BRAND} strokeWidth="2" />
        </g>
      ))}
      <circle cx="40" cy="50" r="18" fill="none" stroke="#b8590a" strokeWidth="3" />
      <path d="M40 22v-8M40 86v-8M12 50h-8M76 50h-8" stroke="#b8590a" strokeWidth="3" strokeLinecap="round" />
      <path d="M232 34a22 22 0 1 0 14 36a18 18 0 1 1 -14 -36z" fill={BRAND} />
      <path d="M70 50h140" stroke={LINE} strokeWidth="2.5" strokeDasharray="4 8" />
    </>
  ),
  urineColours: (
    <>
      {[
        ["#f7efc2", false],
        ["#efd56a", false],
        ["#c98a1c", false],
        ["#e9a3a0", false],
        ["#b3261e", true],
      ].map(([colour, clots], i) => (
        <g key={i} transform={`translate(${12 + i * 50} 60)`}>
          <path d="M4 0h36l-5 120H9z" fill={colour as string} stroke={INK} strokeWidth="2.5" strokeLinejoin="round" />
          {clots ? (
            <>
              <circle cx="18" cy="90" r="5" fill="#5c0d08" />
              <circle cx="28" cy="104" r="4" fill="#5c0d08" />
              <circle cx="16" cy="108" r="3" fill="#5c0d08" />
            </>
          ) : null}
        </g>
      ))}
    </>
  ),
};

/** One of the drawings, 260 × 280 units, with its text alternative (or none when a caption says it). */
export function PictureSvg({ name, alt, captioned = false, className = "" }: { name: PictureKey; alt: string; captioned?: boolean; className?: string }) {
  const label = captioned ? { "aria-hidden": true } : { role: "img", "aria-label": alt };
  return (
    <svg viewBox="0 0 260 280" {...label} className={`h-auto w-full max-w-[16rem] ${className}`} data-picture={name}>
      {captioned ? null : <title>{alt}</title>}
      <rect width="260" height="280" rx="16" fill="#faf7f0" />
      {drawings[name]}
    </svg>
  );
}

/** A drawing with its words under it: the caption is its text alternative, read once. */
export function Picture({ name, alt }: { name: PictureKey; alt: string }) {
  return (
    <figure className="flex flex-col items-center gap-2 rounded-card border border-stone-faint bg-paper-raised p-3" data-testid={`picture-${name}`}>
      <PictureSvg name={name} alt={alt} captioned />
      <figcaption className="text-center text-ink-soft">{alt}</figcaption>
    </figure>
  );
}
