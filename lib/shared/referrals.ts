// Referral values both the settings form and the server read.

/** An unanswered referral is flagged and sent again after a day unless an admin sets otherwise. */
export const DEFAULT_REFERRAL_REMINDER_HOURS = 24;
