import { z } from "zod";

// How the portal reaches a person: a browser's push subscription, the mobile number for texts,
// quiet hours and the reminders they chose (lib/portal/reach.ts; components/reminders).

const base64url = (bytes: number) =>
  z
    .string({ error: "invalid" })
    .regex(/^[A-Za-z0-9_-]+={0,2}$/, { error: "invalid" })
    .refine((s) => s.replace(/=+$/, "").length === Math.ceil((bytes * 4) / 3), { error: "invalid" });

/**
 * A push service's address: https on a public host name. An IP literal or a local name is
 * refused, so a subscription cannot make the server post to its own network.
 */
const pushEndpoint = z
  .url({ error: "invalid" })
  .max(2000, { error: "too_long" })
  .refine((v) => {
    if (!URL.canParse(v)) return false;
    const url = new URL(v);
    const host = url.hostname.toLowerCase();
    if (url.protocol !== "https:" || url.username || url.password) return false;
    if (/^[0-9.]+$/.test(host) || host.includes(":") || host.startsWith("[")) return false;
    return host.includes(".") && !/(^|\.)(localhost|local|internal|localdomain|invalid|test)$/.test(host);
  }, { error: "invalid" });

export const pushSubscribeSchema = z
  .object({
    endpoint: pushEndpoint,
    // The browser's P-256 public key (65 bytes) and auth secret (16 bytes), RFC 8291.
    keys: z.object({ p256dh: base64url(65), auth: base64url(16) }).strict(),
    expirationTime: z.number().nullable().optional(),
  })
  .strict();

export const pushUnsubscribeSchema = z.object({ endpoint: z.string({ error: "invalid" }).min(1).max(2000, { error: "too_long" }) }).strict();

export const REMINDER_KINDS = ["bag", "valve", "change", "drinks", "checkIn"] as const;
export type ReminderKind = (typeof REMINDER_KINDS)[number];
export const REMINDER_CHANNELS = ["push", "sms", "email"] as const;
/** Once a week on the chosen day; the others every day (the change: while it is due). */
export const WEEKLY_REMINDERS: readonly ReminderKind[] = ["bag", "valve", "checkIn"];
/** Device reminders: they stop while no catheter is in place. */
export const DEVICE_REMINDERS: readonly ReminderKind[] = ["bag", "valve", "change"];

const clock = z.string({ error: "invalid" }).regex(/^([01][0-9]|2[0-3]):[0-5][0-9]$/, { error: "invalid" });

export const reminderChoiceSchema = z
  .object({
    on: z.boolean({ error: "invalid" }),
    times: z.array(clock).min(1, { error: "required" }).max(8, { error: "invalid" }),
    // Weekly reminders (bag, valve, check-in): the day, 0 = Sunday.
    day: z.number({ error: "invalid" }).int({ error: "invalid" }).min(0, { error: "invalid" }).max(6, { error: "invalid" }).optional(),
    channel: z.enum(REMINDER_CHANNELS, { error: "invalid" }),
  })
  .strict();

/** E.164 after taking out spaces, dashes, dots and brackets people type ("+44 7700 900123"). */
export const phoneSchema = z
  .string({ error: "invalid" })
  .max(30, { error: "too_long" })
  .transform((v) => v.replace(/[\s().-]/g, ""))
  .refine((v) => v === "" || /^\+[1-9][0-9]{6,14}$/.test(v), { error: "phone_format" });

export const reachSchema = z
  .object({
    phone: phoneSchema,
    smsConsent: z.boolean({ error: "invalid" }),
    quietStart: clock,
    quietEnd: clock,
    reminders: z.partialRecord(z.enum(REMINDER_KINDS), reminderChoiceSchema).optional(),
  })
  .strict()
  .superRefine((v, ctx) => {
    // A text needs a number and the person's yes to texts.
    const wantsText = Object.values(v.reminders ?? {}).some((r) => r?.on && r.channel === "sms");
    if (wantsText && !v.phone) ctx.addIssue({ code: "custom", path: ["phone"], message: "required" });
    if (wantsText && !v.smsConsent) ctx.addIssue({ code: "custom", path: ["smsConsent"], message: "sms_consent" });
  });
