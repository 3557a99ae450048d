"use client";
// Each observation over the patient's visits, drawn with recharts on the NEWS2 chart's own bands
// (lib/clinical NEWS2_BANDS: shaded by the sub-score a value there gets), and the NEWS2 total on
// its risk bands. The charts are pictures for the eye; the table under them (ObservationTable)
// holds the same numbers for a screen reader.
import { useTranslations } from "next-intl";
import { useFormat } from "@/components/i18n/format";
import { CartesianGrid, Line, LineChart, ReferenceArea, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { NEWS2_BANDS } from "@/lib/clinical";
import { palette } from "@/tailwind.config";

export type TrendPoint = {
  takenAt: string;
  respirationRate: number;
  spo2: number;
  systolicBp: number;
  pulse: number;
  temperatureC: number;
  total: number;
};

type Param = "respirationRate" | "spo2" | "systolicBp" | "pulse" | "temperatureC" | "total";

// What each chart shows of the scale: the bands that matter at home, not the plausibility bounds.
const DOMAIN: Record<Param, [number, number]> = {
  respirationRate: [4, 36],
  spo2: [84, 100],
  systolicBp: [70, 230],
  pulse: [30, 150],
  temperatureC: [34, 40],
  total: [0, 20],
};

const SCORE_FILL: Record<number, string> = {
  0: "transparent",
  1: palette.level.soon.soft,
  2: palette.level.urgent.soft,
  3: palette.level.emergency.soft,
};

/** Chart 1's bands as y-ranges (upper-inclusive steps on the chart's resolution). */
function bandsOf(param: Param): { y1: number; y2: number; score: number }[] {
  const [lo, hi] = DOMAIN[param];
  if (param === "total") {
    // Source: RCP NEWS2 (2017) chart 3/4 thresholds: 0-4 low, 5-6 medium, 7+ high.
    return [
      { y1: 4.5, y2: 6.5, score: 2 },
      { y1: 6.5, y2: hi, score: 3 },
    ];
  }
  const steps: readonly { upTo: number; score: number }[] =
    param === "spo2" ? NEWS2_BANDS.spo2Scale1 : param === "temperatureC" ? NEWS2_BANDS.temperature : NEWS2_BANDS[param];
  const resolution = param === "temperatureC" ? 0.1 : 1;
  let from = lo;
  return steps
    .map((b) => {
      const y2 = Math.min(hi, b.upTo === Infinity ? hi : b.upTo + resolution / 2);
      const band = { y1: from, y2, score: b.score };
      from = Math.max(from, y2);
      return band;
    })
    .filter((b) => b.y2 > b.y1);
}

export function ObservationTrends({ points }: { points: TrendPoint[] }) {
  const t = useTranslations("Visits.trends");
  const format = useFormat();
  const data = points.map((p) => ({ ...p, label: format.dateTime(new Date(p.takenAt), { day: "numeric", month: "short" }) }));
  const params: Param[] = ["total", "respirationRate", "spo2", "systolicBp", "pulse", "temperatureC"];
  return (
    <div className="grid gap-4 md:grid-cols-2" aria-hidden="true" data-testid="observation-charts">
      {params.map((p) => (
        <figure key={p} className="rounded-card border-2 border-stone-faint bg-paper-raised p-3" data-testid={`trend-${p}`}>
          <figcaption className="font-bold">{t(`param.${p}`)}</figcaption>
          <div className="h-44 w-full" dir="ltr">
            <ResponsiveContainer width="100%" height="100%">
              <LineChart data={data} margin={{ top: 8, right: 12, bottom: 4, left: -12 }}>
                {bandsOf(p).map((b, i) =>
                  b.score > 0 ? <ReferenceArea key={i} y1={b.y1} y2={b.y2} fill={SCORE_FILL[b.score]} fillOpacity={1} ifOverflow="hidden" /> : null,
                )}
                <CartesianGrid stroke={palette.stone.faint} strokeDasharray="3 3" />
                <XAxis dataKey="label" tick={{ fontSize: 12, fill: palette.ink.soft }} />
                <YAxis domain={DOMAIN[p]} allowDataOverflow tick={{ fontSize: 12, fill: palette.ink.soft }} />
                <Tooltip />
                <Line type="linear" dataKey={p} stroke={palette.brand.DEFAULT} strokeWidth={3} dot={{ r: 4 }} isAnimationActive={false} />
              </LineChart>
            </ResponsiveContainer>
          </div>
        </figure>
      ))}
    </div>
  );
}
