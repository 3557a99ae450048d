import { requireNumber } from "./errors";

/** Plausible urinary catheter sizes; outside this range the input is a typing error. */
export const CH_BOUNDS = { min: 4, max: 40 } as const;

const EPS = 1e-9;

/**
 * Outer diameter in mm from Charrière (Ch = 3 × mm), stated rounded UP to 0.1 mm as
 * ISO 20696:2018 5.5.2 states it: 12/14/16/18 Ch → 4.0/4.7/5.4/6.0 mm. Work in tenths
 * of a mm with a tolerance so 12/3 stays exactly 4.0. No colour: no standard code exists.
 * Local policy, the maker's instructions and clinical judgement come first.
 */
export function charriereToMm(ch: number): number {
  requireNumber("sizeCh", ch, CH_BOUNDS.min, CH_BOUNDS.max);
  return Math.ceil((ch * 10) / 3 - EPS) / 10;
}

/**
 * Charrière from a stated outer diameter in mm. Because the mm figure was rounded up, the
 * whole Ch size whose stated diameter matches is returned (4.7 mm → 14 Ch); otherwise
 * 3 × mm to 0.1 Ch.
 */
export function mmToCharriere(mm: number): number {
  // Bounds allow for the rounding up of the largest size.
  requireNumber("diameterMm", mm, 1, 14);
  const stated = Math.round(mm * 10) / 10;
  const whole = Math.floor(mm * 3 + EPS);
  if (whole >= CH_BOUNDS.min && Math.abs(charriereToMm(whole) - stated) < EPS) return whole;
  return Math.round(mm * 30) / 10;
}
