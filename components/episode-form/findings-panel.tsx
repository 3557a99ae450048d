"use client";
// The device-check findings beside the form: each with a word, an icon and a colour (never
// colour alone), its message and its source. A `stop` asks for the override reason here.
import { useTranslations } from "next-intl";
import { DEVICE_RULES, type Finding, type Severity } from "@/lib/clinical";
import type { CheckOutcome, DeviceDraft } from "@/lib/shared/episode-checks";
import { OVERRIDE_MIN_CHARS } from "@/lib/validations/episode";
import { TextArea } from "@/components/ui/field";

const tone: Record<Severity, { box: string; ink: string }> = {
  stop: { box: "border-finding-stop bg-finding-stop-soft", ink: "text-level-emergency-ink" },
  warn: { box: "border-finding-warn bg-finding-warn-soft", ink: "text-level-urgent-ink" },
  info: { box: "border-finding-info bg-finding-info-soft", ink: "text-level-soon-ink" },
};

export function SeverityIcon({ severity, className = "h-6 w-6" }: { severity: Severity; className?: string }) {
  if (severity === "stop") {
    return (
      <svg viewBox="0 0 24 24" className={`${className} shrink-0 text-finding-stop`} aria-hidden="true">
        <path fill="currentColor" d="M8.1 2h7.8L22 8.1v7.8L15.9 22H8.1L2 15.9V8.1z" />
        <path stroke="#fff" strokeWidth="2.6" strokeLinecap="round" d="M7.5 12h9" />
      </svg>
    );
  }
  if (severity === "warn") {
    return (
      <svg viewBox="0 0 24 24" className={`${className} shrink-0 text-finding-warn`} aria-hidden="true">
        <path fill="currentColor" d="M12 2.5 23 21.5H1z" />
        <path stroke="#fff" strokeWidth="2.4" strokeLinecap="round" d="M12 9v6" />
        <circle cx="12" cy="18.3" r="1.3" fill="#fff" />
      </svg>
    );
  }
  return (
    <svg viewBox="0 0 24 24" className={`${className} shrink-0 text-finding-info`} aria-hidden="true">
      <circle cx="12" cy="12" r="10.5" fill="currentColor" />
      <path stroke="#fff" strokeWidth="2.4" strokeLinecap="round" d="M12 11v6.5" />
      <circle cx="12" cy="7.2" r="1.4" fill="#fff" />
    </svg>
  );
}

/** Values the translated messages need, taken from the draft the finding was computed on. */
function messageValues(f: Finding, draft: DeviceDraft, formatDate: (iso: string) => string) {
  const routeMax = draft.route === "suprapubic" ? DEVICE_RULES.routineMaxChSuprapubic.value : DEVICE_RULES.routineMaxChUrethral.value;
  return {
    date: typeof draft.expiry === "string" && draft.expiry ? formatDate(draft.expiry) : "",
    days: f.code === "dwell-over-12-weeks" ? String(draft.maxDwellDays ?? "") : String(DEVICE_RULES.expiryWarnDays.value),
    balloon: String(draft.balloonMl ?? ""),
    maker: String(draft.makerBalloonMl ?? ""),
    usual: String(DEVICE_RULES.usualAdultBalloonMl.value),
    size: String(draft.sizeCh ?? ""),
    max: String(routeMax),
  };
}

export function FindingsPanel({
  outcome,
  draft,
  overrides,
  onOverride,
  overrideErrors,
  formatDate,
}: {
  outcome: CheckOutcome;
  draft: DeviceDraft;
  overrides: Record<string, string>;
  onOverride: (code: string, reason: string) => void;
  /** Codes whose override is missing or too short after a save attempt. */
  overrideErrors: string[];
  formatDate: (iso: string) => string;
}) {
  const t = useTranslations("EpisodeForm");
  const findings = outcome.ok ? outcome.findings : [];
  const stops = findings.filter((f) => f.severity === "stop").length;
  return (
    <section aria-labelledby="findings-title" className="flex flex-col gap-3 rounded-card border border-stone-faint bg-paper-raised p-4" data-testid="findings-panel">
      <h2 id="findings-title" className="text-xl font-bold text-brand">
        {t("findings.title")}
      </h2>
      <p className="text-sm font-bold text-ink-soft">{t("findings.judgement")}</p>
      <div aria-live="polite" className="flex flex-col gap-3">
        {!outcome.ok ? (
          <p className="text-ink-soft">{t("findings.incomplete")}</p>
        ) : findings.length === 0 ? (
          <p className="text-ink-soft" data-testid="findings-none">
            {t("findings.none")}
          </p>
        ) : (
          <>
            <p className="sr-only">{t("findings.count", { count: findings.length, stops })}</p>
            <ul className="flex flex-col gap-3">
              {findings.map((f) => {
                const values = messageValues(f, draft, formatDate);
                const missing = overrideErrors.includes(f.code);
                return (
                  <li
                    key={f.code}
                    className={`flex flex-col gap-2 rounded-lg border-2 border-s-8 p-3 ${tone[f.severity].box}`}
                    data-testid={`finding-${f.code}`}
                    data-severity={f.severity}
                  >
                    <div className="flex items-start gap-2">
                      <SeverityIcon severity={f.severity} />
                      <div className="flex min-w-0 flex-col gap-1">
                        <p className={`font-bold uppercase tracking-wide ${tone[f.severity].ink}`}>{t(`severity.${f.severity}`)}</p>
                        <p className="text-ink">{t(`finding.${f.code}`, values)}</p>
                        <p className="text-sm text-ink-soft">
                          {t("findings.source", { source: t(`source.${f.source as "common-practice"}`) })}
                        </p>
                      </div>
                    </div>
                    {f.severity === "stop" ? (
                      <TextArea
                        label={t("findings.overrideLabel")}
                        hint={t("findings.overrideHint", { min: OVERRIDE_MIN_CHARS })}
                        errors={missing ? [t("errors.override_required")] : undefined}
                        value={overrides[f.code] ?? ""}
                        onChange={(e) => onOverride(f.code, e.target.value)}
                        maxLength={500}
                        data-testid={`override-${f.code}`}
                      />
                    ) : null}
                  </li>
                );
              })}
            </ul>
          </>
        )}
      </div>
    </section>
  );
}
