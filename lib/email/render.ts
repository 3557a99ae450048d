import "server-only";
// One content model, two renderings: the HTML part (escaped by lib/shared/html.ts) and the plain
// text part, so both always say the same thing.
import { directionOf } from "@/lib/i18n/routing";
import { html, safeUrl, type SafeHtml } from "@/lib/shared/html";

export type Tone = "stop" | "warn" | "info";

export type Block =
  | { type: "heading"; text: string }
  | { type: "paragraph"; text: string }
  | { type: "facts"; rows: { label: string; value: string }[] }
  | { type: "list"; items: string[] }
  | { type: "notice"; tone: Tone; label: string; text: string }
  | { type: "table"; head: string[]; rows: string[][] }
  | { type: "action"; href: string; label: string };

export type EmailContent = {
  locale: string;
  subject: string;
  title: string;
  intro?: string;
  blocks: Block[];
  /** Small print: why they got it, that it was sent by Caddis, the safety words. */
  footer: string[];
};

export type RenderedEmail = { subject: string; html: string; text: string };

// Colours from tailwind.config.ts (checked for contrast there).
const c = {
  brand: "#0b5563",
  paper: "#faf7f0",
  raised: "#ffffff",
  sunk: "#f1ece1",
  ink: "#1c1f21",
  soft: "#4f565b",
  line: "#d9d3c6",
  stop: ["#a4231b", "#fbe6e3"],
  warn: ["#8a4b00", "#fdf0d9"],
  info: ["#1f4e99", "#e3ecfa"],
} as const;

function blockHtml(block: Block, start: "left" | "right"): SafeHtml {
  const cell = `padding:6px 10px;border-bottom:1px solid ${c.line};text-align:${start};vertical-align:top`;
  switch (block.type) {
    case "heading":
      return html`<h2 style="font-size:18px;margin:24px 0 8px;color:${c.brand}">${block.text}</h2>`;
    case "paragraph":
      return html`<p style="margin:0 0 12px">${block.text}</p>`;
    case "facts":
      return html`<table role="presentation" style="border-collapse:collapse;width:100%;background:${c.raised};margin:0 0 12px">${block.rows.map(
        (r) => html`<tr><th scope="row" style="${cell};width:40%;font-weight:bold;color:${c.soft}">${r.label}</th><td style="${cell}">${r.value}</td></tr>`,
      )}</table>`;
    case "list":
      return html`<ul style="margin:0 0 12px;padding-inline-start:20px">${block.items.map((i) => html`<li style="margin:0 0 4px">${i}</li>`)}</ul>`;
    case "notice": {
      const [strong, soft] = c[block.tone];
      const side = start === "left" ? "border-left" : "border-right";
      return html`<div style="${side}:6px solid ${strong};background:${soft};padding:10px 12px;margin:0 0 12px"><strong style="color:${strong}">${block.label}</strong> ${block.text}</div>`;
    }
    case "table":
      return html`<table style="border-collapse:collapse;width:100%;background:${c.raised};margin:0 0 12px"><thead><tr>${block.head.map(
        (h) => html`<th scope="col" style="${cell};background:${c.sunk}">${h}</th>`,
      )}</tr></thead><tbody>${block.rows.map((row) => html`<tr>${row.map((v) => html`<td style="${cell}">${v}</td>`)}</tr>`)}</tbody></table>`;
    case "action":
      return html`<p style="margin:16px 0"><a href="${safeUrl(block.href)}" style="display:inline-block;background:${c.brand};color:#ffffff;text-decoration:none;font-weight:bold;padding:12px 20px;border-radius:8px">${block.label}</a></p>`;
  }
}

export function renderHtml(content: EmailContent): string {
  const dir = directionOf(content.locale);
  const start = dir === "rtl" ? "right" : "left";
  const font =
    content.locale === "ur"
      ? "'Noto Nastaliq Urdu', 'Noto Naskh Arabic', Tahoma, Arial, sans-serif"
      : dir === "rtl"
      ? "'Noto Naskh Arabic', Tahoma, Arial, sans-serif"
      : "'Atkinson Hyperlegible', 'Noto Sans', Arial, sans-serif";
  return html`<!doctype html>
<html lang="${content.locale}" dir="${dir}">
<head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1"><title>${content.subject}</title></head>
<body style="margin:0;padding:0;background:${c.paper};color:${c.ink};font-family:${font};font-size:16px;line-height:1.5">
<div style="max-width:640px;margin:0 auto;padding:24px;text-align:${start}">
<p style="margin:0 0 16px;font-size:20px;font-weight:bold;color:${c.brand}">Caddis</p>
<h1 style="font-size:24px;line-height:1.3;margin:0 0 12px">${content.title}</h1>
${content.intro ? html`<p style="margin:0 0 12px">${content.intro}</p>` : null}
${content.blocks.map((b) => blockHtml(b, start))}
<hr style="border:none;border-top:1px solid ${c.line};margin:24px 0 12px">
${content.footer.map((f) => html`<p style="margin:0 0 8px;font-size:14px;color:${c.soft}">${f}</p>`)}
</div>
</body>
</html>
`.value;
}

function underline(text: string, ch: string) {
  return `${text}\n${ch.repeat(Math.min(Math.max(text.length, 3), 72))}`;
}

export function renderText(content: EmailContent): string {
  const out: string[] = [underline(content.title, "=")];
  if (content.intro) out.push(content.intro);
  for (const b of content.blocks) {
    switch (b.type) {
      case "heading":
        out.push(underline(b.text, "-"));
        break;
      case "paragraph":
        out.push(b.text);
        break;
      case "facts":
        out.push(b.rows.map((r) => `${r.label}: ${r.value}`).join("\n"));
        break;
      case "list":
        out.push(b.items.map((i) => `- ${i}`).join("\n"));
        break;
      case "notice":
        out.push(`[!] ${b.label} ${b.text}`);
        break;
      case "table":
        out.push([b.head, ...b.rows].map((r) => r.join(" | ")).join("\n"));
        break;
      case "action":
        out.push(`${b.label}: ${safeUrl(b.href)}`);
        break;
    }
  }
  out.push(`--\n${content.footer.join("\n")}`);
  return `${out.join("\n\n")}\n`;
}

export function renderEmail(content: EmailContent): RenderedEmail {
  return { subject: content.subject, html: renderHtml(content), text: renderText(content) };
}
