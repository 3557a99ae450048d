// Auto-escaping HTML for e-mail bodies and the plain device-card documents (lib/qr/card-html.ts).
// Every interpolated value is entity-encoded (OWASP XSS prevention, rule 1: & < > " ') unless
// it is SafeHtml made by this same tag, so text a patient typed can never become markup.
// Why not React's renderToStaticMarkup: e-mails are composed inside route handlers'
// transactions, and Next.js refuses react-dom/server in App Router route handlers.
// Interpolate only into element content and double-quoted attribute values.

export class SafeHtml {
  constructor(readonly value: string) {}
  toString() {
    return this.value;
  }
}

type Value = string | number | SafeHtml | null | undefined | false | readonly Value[];

const entities: Record<string, string> = { "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" };

export function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => entities[c]);
}

function encode(value: Value): string {
  if (value === null || value === undefined || value === false) return "";
  if (value instanceof SafeHtml) return value.value;
  if (Array.isArray(value)) return value.map(encode).join("");
  return escapeHtml(String(value));
}

/** html`<p>${text}</p>`: the literal parts are trusted, every value is escaped. */
export function html(strings: TemplateStringsArray, ...values: Value[]): SafeHtml {
  let out = strings[0];
  for (let i = 0; i < values.length; i++) out += encode(values[i]) + strings[i + 1];
  return new SafeHtml(out);
}

/** Only http(s) and mailto links; anything else (javascript:, data:) becomes "#". */
export function safeUrl(url: string): string {
  try {
    const u = new URL(url);
    return u.protocol === "https:" || u.protocol === "http:" || u.protocol === "mailto:" ? u.toString() : "#";
  } catch {
    return "#";
  }
}
