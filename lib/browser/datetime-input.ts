// Values for <input type="datetime-local">, which speaks the browser's own zone. Calendar days
// in the deployment's zone are lib/shared/time-zone.ts.

/** Now, to the minute, as an ISO instant: where a form's "when" starts. */
export function thisMinute(): string {
  return new Date(Math.floor(Date.now() / 60_000) * 60_000).toISOString();
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
