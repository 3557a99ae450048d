// Calendar dates in the deployment's time zone, so the server and the browser agree on which
// day a catheter went in (a device's expiry and the planned dates count from that day).

/** The same zone next-intl formats dates in (lib/i18n/request.ts). */
export function deploymentTimeZone(): string {
  return process.env.CADDIS_TIME_ZONE ?? "Europe/London";
}

/** YYYY-MM-DD of an instant in a time zone. */
export function calendarDate(at: Date, timeZone: string): string {
  const parts = new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" }).formatToParts(at);
  const get = (type: string) => parts.find((p) => p.type === type)?.value ?? "";
  return `${get("year")}-${get("month")}-${get("day")}`;
}

/** "YYYY-MM-DDTHH:mm" for a datetime-local input, in the browser's own zone. */
export function toLocalInputValue(iso: string | undefined): string {
  if (!iso) return "";
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return "";
  const pad = (n: number) => String(n).padStart(2, "0");
  return `${d.getFullYear()}-${pad(d.getMonth() + 1)}-${pad(d.getDate())}T${pad(d.getHours())}:${pad(d.getMinutes())}`;
}

/** A datetime-local value (browser zone) → ISO instant, or "" when empty or impossible. */
export function fromLocalInputValue(value: string): string {
  if (!value) return "";
  const d = new Date(value);
  return Number.isNaN(d.getTime()) ? "" : d.toISOString();
}
