// "Today" as a calendar date where the people are (the deployment's zone, the same one
// next-intl formats with), not the server's UTC clock.
export const APP_TIME_ZONE = process.env.CADDIS_TIME_ZONE ?? "Europe/London";

export function todayIn(timeZone = APP_TIME_ZONE, now = new Date()): string {
  // en-CA formats as YYYY-MM-DD.
  return new Intl.DateTimeFormat("en-CA", { timeZone, year: "numeric", month: "2-digit", day: "2-digit" }).format(now);
}
