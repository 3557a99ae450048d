import "server-only";
// Typed getters for the deployment settings an admin keeps on the Settings page. Nothing has a
// default hidden here: a setting that is not configured is null, and the screen that needs it
// says so (e.g. the portal says the emergency number is not configured).
import type { Executor } from "@/db";
import { readSettingRows, writeSettings } from "@/db/queries/settings";
import { BAG_INTERVALS, planDefaults, TWOC_DEFAULTS, type Material, type PlanDatesOptions, type PlanDefaults } from "@/lib/clinical";
import { DEFAULT_REFERRAL_REMINDER_HOURS } from "@/lib/shared/referrals";
import { settingKeys, settingSchemas, type SettingsPatch, type TranslatedLocale, type TranslationReview } from "@/lib/validations/settings";
import { DEFAULT_WORKING_HOURS, minutesOfClock, type WorkingHours } from "@/lib/shared/working-hours";

export type DeploymentSettings = {
  /** Digits the portal shows and dials in an emergency; null when not configured. */
  emergencyNumber: string | null;
  /** Two-letter region (GB) whose conventions dates and numbers follow; null: the language's own. */
  region: string | null;
  /** The name of the out-of-hours service, e.g. shown beside a team's out-of-hours number. */
  outOfHoursServiceName: string | null;
  /** Starting values for lib/clinical `planDates`; null or missing means the rule's own default. */
  reviewIntervalDays: number | null;
  dueSoonDays: number | null;
  defaultMaxDwellDays: Partial<Record<Material, number>>;
  /** Days a closed record is kept, read-only, before the retention job removes it; null keeps it. */
  retentionDays: number | null;
  /** Working minutes within which an alert on the caseload is to be acknowledged; null → 120. */
  acknowledgeWithinMinutes: number | null;
  /** The working day those minutes are counted in ("08:00", "18:00"); null → DEFAULT_WORKING_HOURS. */
  workingDayStart: string | null;
  workingDayEnd: string | null;
  /** The out-of-hours service's number, shown where the lead team has no out-of-hours number. */
  outOfHoursPhone: string | null;
  /** Hours before an unanswered referral is flagged and sent again; null means the default. */
  referralReminderHours: number | null;
  /** Per translated language, who reviewed its patient texts and when; a missing language is not reviewed. */
  translationReviews: Partial<Record<TranslatedLocale, TranslationReview>>;
  /** Hours after a removal for a trial by which the patient should have passed urine; null → the default. */
  twocVoidWindowHours: number | null;
  spareCatheters: number | null;
};

/** Two hours of working time (the default the care teams asked for; common practice, no source). */
export const DEFAULT_ACKNOWLEDGE_WITHIN_MINUTES = 120;

function parse<K extends keyof typeof settingSchemas>(key: K, value: unknown) {
  const r = settingSchemas[key].safeParse(value);
  if (!r.success) {
    // A bad stored value counts as not configured, loudly, rather than as a guess.
    console.error(`[settings] stored value of ${key} is not valid; treated as not configured`);
    return null;
  }
  return r.data;
}

/**
 * One stored setting read as JSON text inside another statement (the device card reads its
 * three in the same round trip): validated like getSettings, null when unset or not valid.
 */
export function settingFromJson<K extends keyof typeof settingSchemas>(key: K, json: string | null): DeploymentSettings[K & keyof DeploymentSettings] | null {
  return json === null ? null : (parse(key, JSON.parse(json)) as DeploymentSettings[K & keyof DeploymentSettings] | null);
}

export async function getSettings(tx?: Executor): Promise<DeploymentSettings> {
  const rows = await readSettingRows(tx);
  const raw = new Map(rows.map((r) => [r.key, r.value]));
  const get = <K extends keyof typeof settingSchemas>(key: K) => (raw.has(key) ? parse(key, raw.get(key)) : null);
  return {
    emergencyNumber: get("emergencyNumber") as string | null,
    region: get("region") as string | null,
    outOfHoursServiceName: get("outOfHoursServiceName") as string | null,
    reviewIntervalDays: get("reviewIntervalDays") as number | null,
    dueSoonDays: get("dueSoonDays") as number | null,
    defaultMaxDwellDays: (get("defaultMaxDwellDays") as Partial<Record<Material, number>> | null) ?? {},
    retentionDays: get("retentionDays") as number | null,
    acknowledgeWithinMinutes: get("acknowledgeWithinMinutes") as number | null,
    workingDayStart: get("workingDayStart") as string | null,
    workingDayEnd: get("workingDayEnd") as string | null,
    outOfHoursPhone: get("outOfHoursPhone") as string | null,
    referralReminderHours: get("referralReminderHours") as number | null,
    translationReviews: (get("translationReviews") as Partial<Record<TranslatedLocale, TranslationReview>> | null) ?? {},
    twocVoidWindowHours: get("twocVoidWindowHours") as number | null,
    spareCatheters: get("spareCatheters") as number | null,
  };
}

/** The emergency number to show patients, or null when not configured. */
export async function getEmergencyNumber(tx?: Executor): Promise<string | null> {
  return (await getSettings(tx)).emergencyNumber;
}

/** How long an alert may wait for acknowledgement, in working minutes, and the working hours. */
export async function getAcknowledgePlan(tx?: Executor): Promise<{ minutes: number; hours: WorkingHours }> {
  const s = await getSettings(tx);
  const start = s.workingDayStart ? minutesOfClock(s.workingDayStart) : null;
  const end = s.workingDayEnd ? minutesOfClock(s.workingDayEnd) : null;
  const hours = { ...DEFAULT_WORKING_HOURS, ...(start !== null ? { start } : {}), ...(end !== null ? { end } : {}) };
  if (hours.end <= hours.start) {
    // A day that ends before it starts would never count: the defaults, loudly.
    console.error("[settings] the working day ends before it starts; the default hours are used");
    return { minutes: s.acknowledgeWithinMinutes ?? DEFAULT_ACKNOWLEDGE_WITHIN_MINUTES, hours: DEFAULT_WORKING_HOURS };
  }
  return { minutes: s.acknowledgeWithinMinutes ?? DEFAULT_ACKNOWLEDGE_WITHIN_MINUTES, hours };
}

/** Hours a referral may stay unanswered before it is flagged and sent again to the receiving team. */
export async function getReferralReminderHours(tx?: Executor): Promise<number> {
  return (await getSettings(tx)).referralReminderHours ?? DEFAULT_REFERRAL_REMINDER_HOURS;
}

/** The region dates and numbers are written for (lib/shared/formats), or null. */
export async function getRegion(tx?: Executor): Promise<string | null> {
  return (await getSettings(tx)).region;
}

/** The medical translator's review of a language's patient texts, or null (not reviewed; English is the source). */
export async function getTranslationReview(locale: string, tx?: Executor): Promise<TranslationReview | null> {
  const reviews = (await getSettings(tx)).translationReviews;
  return (reviews as Record<string, TranslationReview | undefined>)[locale] ?? null;
}

/** Hours a trial without catheter may run before it is overdue (setting, else lib/clinical's default). */
export async function getTwocVoidWindowHours(tx?: Executor): Promise<number> {
  return (await getSettings(tx)).twocVoidWindowHours ?? TWOC_DEFAULTS.voidWindowHours.value;
}

/** The caseload's two windows (due soon, trial overdue) from one read of the settings. */
export async function getCaseloadWindows(tx?: Executor): Promise<{ dueSoonDays: number; twocWindowHours: number }> {
  const s = await getSettings(tx);
  return { dueSoonDays: planDefaults(planDatesOptions(s)).dueSoonDays, twocWindowHours: s.twocVoidWindowHours ?? TWOC_DEFAULTS.voidWindowHours.value };
}

/** Spare catheters in a supply request (setting, else lib/clinical's default of one, common practice). */
export async function getSpareCatheters(tx?: Executor): Promise<number> {
  return (await getSettings(tx)).spareCatheters ?? BAG_INTERVALS.spareCatheters.value;
}

/** Options for lib/clinical `planDates` from the deployment settings. */
export function planDatesOptions(s: DeploymentSettings, extra: PlanDatesOptions = {}): PlanDatesOptions {
  return {
    ...(s.reviewIntervalDays !== null ? { reviewIntervalDays: s.reviewIntervalDays } : {}),
    ...(s.dueSoonDays !== null ? { dueSoonDays: s.dueSoonDays } : {}),
    ...(Object.keys(s.defaultMaxDwellDays).length ? { defaultMaxDwellDays: s.defaultMaxDwellDays } : {}),
    ...extra,
  };
}

/**
 * The planning values in force (review interval, due-soon window, change interval by material):
 * what the admin set, else the rules' defaults. The one way episodes, the episode forms, the
 * record, the caseload, the digest and the reminders learn them.
 */
export async function getPlanDefaults(tx?: Executor): Promise<PlanDefaults> {
  return planDefaults(planDatesOptions(await getSettings(tx)));
}

/** Applies a validated change; returns the keys that changed (for the audit event). */
export async function updateSettings(tx: Executor, patch: SettingsPatch): Promise<(keyof DeploymentSettings)[]> {
  const values: Record<string, unknown> = {};
  for (const key of settingKeys) if (key in patch) values[key] = patch[key] ?? null;
  await writeSettings({ values }, tx);
  return Object.keys(values) as (keyof DeploymentSettings)[];
}
