// The words of a catheter's record, defined once: the database schema, the zod schemas, the
// forms, the PDFs and the labels all take their values from here (device words are in
// device-types.ts).

/** What happened to a catheter or its patient, as the record lists it. */
export const EPISODE_EVENT_KINDS = [
  "insertion",
  "planned_change",
  "unplanned_change",
  "problem",
  "removal",
  "twoc_outcome",
  "visit",
  "review",
] as const;
export type EpisodeEventKind = (typeof EPISODE_EVENT_KINDS)[number];

/** Why a catheter was changed before its planned date. */
export const UNPLANNED_REASONS = ["blockage", "bypassing", "expelled", "infection", "other"] as const;
export type UnplannedReason = (typeof UNPLANNED_REASONS)[number];

export const REMOVAL_REASONS = ["no-longer-needed", "trial-without-catheter", "problem", "patient-choice", "other"] as const;

/**
 * A trial without catheter (TWOC): passed, failed, or abandoned before it could be judged (the
 * patient unwell, declined to go on, had to leave); a failed or abandoned trial says what was done.
 */
export const TWOC_OUTCOMES = ["passed", "failed", "abandoned"] as const;
export type TwocOutcome = (typeof TWOC_OUTCOMES)[number];
export const TWOC_FAILED_ACTIONS = ["re-catheterised", "intermittent-self-catheterisation", "referred", "other"] as const;
export type TwocFailedAction = (typeof TWOC_FAILED_ACTIONS)[number];
/** What the patient felt during the trial (none ticked: none reported). */
export const TWOC_SYMPTOMS = ["urgency", "frequency", "pain-passing-urine", "lower-tummy-pain", "feels-not-empty", "leaking", "blood-in-urine", "fever"] as const;
export type TwocSymptom = (typeof TWOC_SYMPTOMS)[number];

/**
 * What stays on the care team's caseload until someone deals with it: an urgent or emergency
 * check-in, a NEWS2 that alerted, and a urine sample's result still to chase.
 */
export const CASELOAD_ITEM_KINDS = ["check-in", "news2", "sample-result"] as const;

/** What a nurse did about an alert when acknowledging it ("other" needs a note). */
export const ACKNOWLEDGE_ACTIONS = ["phoned", "visited", "sent-to-gp", "advised-emergency", "other"] as const;

/** What a community visit finds (the structured visit form). */
export const URINE_APPEARANCES = ["clear", "cloudy", "blood", "debris"] as const;
/** The meatus or the suprapubic site. */
export const SITE_CONDITIONS = ["healthy", "red-or-sore", "discharge", "overgranulation", "other"] as const;
/** What the discharging nurse taught before the patient went home (the discharge checklist). */
export const DISCHARGE_TEACHING = ["emptying-bag", "changing-bags", "leg-and-night-bags", "washing", "drinks", "constipation", "when-to-get-help"] as const;

/** How the catheter drains at home: through a valve, or freely into a bag. */
export const DRAINAGE_KINDS = ["valve", "bag"] as const;

/** A referral from one care-team organisation to another. */
export const REFERRAL_STATUSES = ["pending", "accepted", "declined", "withdrawn"] as const;
