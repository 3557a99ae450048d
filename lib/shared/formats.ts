// The one way dates and numbers are written, on the server, in the browser, in e-mails and PDFs.
// The language comes from the page; the region (day-month order, 24-hour clock, digit grouping)
// from the deployment's Settings, so English in a deployment that dials 999 reads "3 December".
// A date in another year than today always shows its year.
type DateTimeOptions = Intl.DateTimeFormatOptions;
type NumberOptions = Intl.NumberFormatOptions;

/** "en" + "GB" → "en-GB"; without a region (or one Intl does not take) the language alone. */
export function formattingLocale(locale: string, region: string | null | undefined): string {
  if (!region || !/^[A-Z]{2}$/.test(region)) return locale;
  const tag = `${locale}-${region}`;
  try {
    return Intl.DateTimeFormat.supportedLocalesOf([tag]).length ? tag : locale;
  } catch {
    return locale;
  }
}

const dateFormats = new Map<string, Intl.DateTimeFormat>();
const numberFormats = new Map<string, Intl.NumberFormat>();
function cached<O, F>(store: Map<string, F>, tag: string, options: O, make: (o: O) => F): F {
  const key = `${tag} ${JSON.stringify(options)}`;
  let f = store.get(key);
  if (!f) store.set(key, (f = make(options)));
  return f;
}

const yearIn = (d: Date, timeZone: string) => new Intl.DateTimeFormat("en", { timeZone, year: "numeric" }).format(d);

export type Format = {
  /** The locale tag used, e.g. "en-GB". */
  tag: string;
  dateTime(value: Date | number, options?: DateTimeOptions): string;
  number(value: number, options?: NumberOptions): string;
};

export function makeFormat({ locale, region, timeZone, now = new Date() }: { locale: string; region: string | null | undefined; timeZone: string; now?: Date }): Format {
  const tag = formattingLocale(locale, region);
  return {
    tag,
    dateTime(value, options) {
      const d = typeof value === "number" ? new Date(value) : value;
      if (options && !options.dateStyle && (options.month || options.day) && !options.year) {
        const zone = options.timeZone ?? timeZone;
        if (yearIn(d, zone) !== yearIn(now, zone)) options = { ...options, year: "numeric" };
      }
      return cached(dateFormats, tag, { timeZone, ...options }, (o) => new Intl.DateTimeFormat(tag, o)).format(d);
    },
    number: (value, options = {}) => cached(numberFormats, tag, options, (o) => new Intl.NumberFormat(tag, o)).format(value),
  };
}
