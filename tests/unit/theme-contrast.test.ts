// WCAG 2.2 AA 1.4.3: text 4.5:1, large text and controls 3:1, computed with the WCAG formula.
import { describe, expect, it } from "vitest";
import { palette } from "@/tailwind.config";

function luminance(hex: string) {
  const [r, g, b] = [1, 3, 5].map((i) => parseInt(hex.slice(i, i + 2), 16) / 255).map((c) => (c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4));
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}
export function contrast(a: string, b: string) {
  const [hi, lo] = [luminance(a), luminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

const textPairs: [string, string, string][] = [
  ["ink on paper", palette.ink.DEFAULT, palette.paper.DEFAULT],
  ["ink-soft on paper", palette.ink.soft, palette.paper.DEFAULT],
  ["ink-soft on sunk paper", palette.ink.soft, palette.paper.sunk],
  ["stone on paper", palette.stone.DEFAULT, palette.paper.DEFAULT],
  ["brand on paper", palette.brand.DEFAULT, palette.paper.DEFAULT],
  ["brand on brand-soft", palette.brand.DEFAULT, palette.brand.soft],
  ["white on brand", "#ffffff", palette.brand.DEFAULT],
  ["white on emergency", "#ffffff", palette.level.emergency.DEFAULT],
  ["emergency ink on its soft", palette.level.emergency.ink, palette.level.emergency.soft],
  ["urgent ink on its soft", palette.level.urgent.ink, palette.level.urgent.soft],
  ["white on urgent", "#ffffff", palette.level.urgent.DEFAULT],
  ["soon ink on its soft", palette.level.soon.ink, palette.level.soon.soft],
  ["white on soon", "#ffffff", palette.level.soon.DEFAULT],
  ["self-care ink on its soft", palette.level.selfcare.ink, palette.level.selfcare.soft],
  ["white on self-care", "#ffffff", palette.level.selfcare.DEFAULT],
  ["stop on its soft", palette.finding.stop.DEFAULT, palette.finding.stop.soft],
  ["warn on its soft", palette.finding.warn.DEFAULT, palette.finding.warn.soft],
  ["info on its soft", palette.finding.info.DEFAULT, palette.finding.info.soft],
];

const controlPairs: [string, string, string][] = [
  ["input border on raised paper", palette.stone.line, palette.paper.raised],
  ["focus ring on paper", palette.focus, palette.paper.DEFAULT],
];

describe("colour tokens meet WCAG 2.2 AA", () => {
  it.each(textPairs)("%s ≥ 4.5:1", (_name, fg, bg) => {
    expect(contrast(fg, bg)).toBeGreaterThanOrEqual(4.5);
  });
  it.each(controlPairs)("%s ≥ 3:1 (1.4.11)", (_name, fg, bg) => {
    expect(contrast(fg, bg)).toBeGreaterThanOrEqual(3);
  });
});
