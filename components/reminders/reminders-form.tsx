"use client";
// More → Reminders: the patient's reminders (what, when, how), the mobile number with consent to
// texts, quiet hours, and notifications on this phone (Web Push). A carer sees the number, quiet
// hours and notifications only (her alerts choose their channel on More).
import { useTranslations } from "next-intl";
import { useEffect, useState } from "react";
import { Checkbox } from "@/components/ui/choice";
import { Field, SelectField } from "@/components/ui/field";
import { buttonClass } from "@/components/ui/button";
import { DoneStatus, ErrorAlert } from "@/components/ui/notice";
import { useErrorText } from "@/components/ui/use-error-text";
import { apiFetch, isApiError } from "@/lib/browser/api-client";
import { REMINDER_CHANNELS, REMINDER_KINDS, WEEKLY_REMINDERS, type ReminderKind } from "@/lib/validations/reach";

type Choice = { on: boolean; times: string[]; day?: number; channel: (typeof REMINDER_CHANNELS)[number] };
export type ReachValue = { phone: string; smsConsent: boolean; quietStart: string; quietEnd: string; reminders: Partial<Record<string, Choice>> };

const DEFAULT_TIMES: Record<ReminderKind, string[]> = { bag: ["09:00"], valve: ["09:00"], change: ["09:00"], drinks: ["09:00", "12:00", "15:00", "18:00"], checkIn: ["10:00"] };

type PushState = "unknown" | "unavailable" | "denied" | "off" | "on";

function urlBase64ToBytes(base64: string) {
  const padded = (base64 + "=".repeat((4 - (base64.length % 4)) % 4)).replace(/-/g, "+").replace(/_/g, "/");
  const raw = atob(padded);
  return Uint8Array.from(raw, (c) => c.charCodeAt(0));
}

export function RemindersForm({ initial, withReminders, noCatheter }: { initial: ReachValue; withReminders: boolean; noCatheter: boolean }) {
  const t = useTranslations("Reminders");
  const errorText = useErrorText("Reminders");
  const [value, setValue] = useState<ReachValue>(initial);
  const [saved, setSaved] = useState(false);
  const [saving, setSaving] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [fields, setFields] = useState<Record<string, string[]>>({});
  const [push, setPush] = useState<PushState>("unknown");

  useEffect(() => {
    void (async () => {
      if (!("serviceWorker" in navigator) || !("PushManager" in window) || !("Notification" in window)) return setPush("unavailable");
      if (Notification.permission === "denied") return setPush("denied");
      const reg = await navigator.serviceWorker.getRegistration();
      const sub = await reg?.pushManager.getSubscription();
      setPush(sub ? "on" : "off");
    })().catch(() => setPush("unavailable"));
  }, []);

  async function allowPush() {
    try {
      const { publicKey } = await apiFetch<{ publicKey: string | null }>("/api/account/push");
      if (!publicKey) return setPush("unavailable");
      if ((await Notification.requestPermission()) !== "granted") return setPush("denied");
      const reg = await navigator.serviceWorker.ready;
      const sub = await reg.pushManager.subscribe({ userVisibleOnly: true, applicationServerKey: urlBase64ToBytes(publicKey) });
      await apiFetch("/api/account/push", { method: "POST", body: sub.toJSON() });
      setPush("on");
    } catch {
      setPush("unavailable");
    }
  }

  const choiceOf = (kind: ReminderKind): Choice => value.reminders[kind] ?? { on: false, times: DEFAULT_TIMES[kind], channel: "sms", ...(WEEKLY_REMINDERS.includes(kind) ? { day: 1 } : {}) };
  const setChoice = (kind: ReminderKind, next: Partial<Choice>) => {
    setSaved(false);
    setValue((v) => ({ ...v, reminders: { ...v.reminders, [kind]: { ...choiceOf(kind), ...next } } }));
  };

  async function save(event: React.FormEvent) {
    event.preventDefault();
    setSaving(true);
    setSaved(false);
    setError(null);
    setFields({});
    try {
      const body = { phone: value.phone, smsConsent: value.smsConsent, quietStart: value.quietStart, quietEnd: value.quietEnd, ...(withReminders ? { reminders: value.reminders } : {}) };
      const answer = await apiFetch<{ reach: ReachValue }>("/api/account/reach", { method: "PUT", body });
      setValue(answer.reach);
      setSaved(true);
    } catch (e) {
      if (isApiError(e) && Object.keys(e.fields).length) setFields(e.fields);
      setError(errorText.ofError(e));
    } finally {
      setSaving(false);
    }
  }

  const section = "flex flex-col gap-3 rounded-lg border border-stone-faint bg-paper-raised p-4";
  const days = [1, 2, 3, 4, 5, 6, 0].map((d) => ({ value: String(d), label: t(`days.${d}` as "days.0") }));
  const channels = REMINDER_CHANNELS.map((c) => ({ value: c, label: t(`channels.${c}`) }));

  return (
    <form onSubmit={save} className="flex flex-col gap-5" noValidate data-testid="reminders-form">
      {withReminders ? (
        <>
          {noCatheter ? <p className="rounded-lg border-2 border-stone-faint p-3">{t("noCatheter")}</p> : null}
          {REMINDER_KINDS.map((kind) => {
            const c = choiceOf(kind);
            return (
              <fieldset key={kind} className={section} data-reminder={kind}>
                <legend className="sr-only">{t(`kinds.${kind}`)}</legend>
                <h2 className="text-xl font-bold" aria-hidden="true">
                  {t(`kinds.${kind}`)}
                </h2>
                <p>{t(`hints.${kind}`)}</p>
                <Checkbox label={t("on")} checked={c.on} onChange={(e) => setChoice(kind, { on: e.target.checked })} name={`${kind}-on`} />
                {c.on ? (
                  <>
                    {WEEKLY_REMINDERS.includes(kind) ? (
                      <SelectField label={t("day")} options={days} value={String(c.day ?? 1)} onChange={(e) => setChoice(kind, { day: Number(e.target.value) })} name={`${kind}-day`} />
                    ) : null}
                    {c.times.map((time, i) => (
                      <div key={i} className="flex flex-wrap items-end gap-2">
                        <Field
                          label={t("time")}
                          type="time"
                          value={time}
                          name={`${kind}-time-${i}`}
                          className="min-w-40 flex-1"
                          onChange={(e) => setChoice(kind, { times: c.times.map((x, j) => (j === i ? e.target.value : x)) })}
                        />
                        {c.times.length > 1 ? (
                          <button type="button" className={buttonClass("secondary")} onClick={() => setChoice(kind, { times: c.times.filter((_, j) => j !== i) })}>
                            {t("removeTime")}
                          </button>
                        ) : null}
                      </div>
                    ))}
                    {kind === "drinks" && c.times.length < 8 ? (
                      <button type="button" className={buttonClass("secondary")} onClick={() => setChoice(kind, { times: [...c.times, "20:00"] })}>
                        {t("addTime")}
                      </button>
                    ) : null}
                    <SelectField label={t("channel")} options={channels} value={c.channel} name={`${kind}-channel`} onChange={(e) => setChoice(kind, { channel: e.target.value as Choice["channel"] })} />
                  </>
                ) : null}
              </fieldset>
            );
          })}
        </>
      ) : null}

      <section className={section} aria-labelledby="texts-title">
        <h2 id="texts-title" className="text-xl font-bold">
          {t("textTitle")}
        </h2>
        <Field
          label={t("phone")}
          hint={t("phoneHint")}
          type="tel"
          dir="ltr"
          autoComplete="tel"
          inputMode="tel"
          name="phone"
          value={value.phone}
          errors={errorText.list(fields.phone)}
          onChange={(e) => {
            setSaved(false);
            setValue({ ...value, phone: e.target.value });
          }}
        />
        <Checkbox
          label={t("smsConsent")}
          name="smsConsent"
          checked={value.smsConsent}
          errors={errorText.list(fields.smsConsent)}
          onChange={(e) => {
            setSaved(false);
            setValue({ ...value, smsConsent: e.target.checked });
          }}
        />
      </section>

      <section className={section} aria-labelledby="quiet-title">
        <h2 id="quiet-title" className="text-xl font-bold">
          {t("quietTitle")}
        </h2>
        <p>{t("quietHint")}</p>
        <div className="flex flex-wrap gap-3">
          <Field label={t("quietStart")} type="time" name="quietStart" className="min-w-40 flex-1" value={value.quietStart} onChange={(e) => setValue({ ...value, quietStart: e.target.value })} />
          <Field label={t("quietEnd")} type="time" name="quietEnd" className="min-w-40 flex-1" value={value.quietEnd} onChange={(e) => setValue({ ...value, quietEnd: e.target.value })} />
        </div>
      </section>

      <section className={section} aria-labelledby="push-title">
        <h2 id="push-title" className="text-xl font-bold">
          {t("pushTitle")}
        </h2>
        {push === "on" ? <p>{t("pushOn")}</p> : null}
        {push === "off" ? (
          <button type="button" className={buttonClass("secondary")} onClick={() => void allowPush()}>
            {t("pushAllow")}
          </button>
        ) : null}
        {push === "unavailable" ? <p>{t("pushUnavailable")}</p> : null}
        {push === "denied" ? <p>{t("pushDenied")}</p> : null}
      </section>

      <ErrorAlert message={error} />
      <button type="submit" className={buttonClass("primary")} disabled={saving}>
        {t("save")}
      </button>
      <DoneStatus message={saved ? t("saved") : null} />
    </form>
  );
}
