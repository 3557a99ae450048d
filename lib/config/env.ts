import "server-only";
import { z } from "zod";

// Every setting Caddis reads from the environment, validated once. Defaults are the loopback
// services that `npm start` and `npm test` bring up; production sets each one explicitly.
const schema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  APP_URL: z.url().default("http://localhost:3000"),
  // The identifier system of the health record number in the FHIR export: the issuing
  // organisation's namespace URI (e.g. an OID as urn:oid:…), never this app's own address.
  FHIR_HRN_SYSTEM: z.url().default("https://fhir.eastmere.example/Id/health-record-number"),
  DATABASE_URL: z.string().min(1).default("postgres://postgres@127.0.0.1:5433/caddis"),
  DATABASE_POOL_MAX: z.coerce.number().int().min(1).max(100).default(10),
  BETTER_AUTH_SECRET: z.string().min(32).optional(),
  SMTP_URL: z.string().min(1).default("smtp://127.0.0.1:1025"),
  MAIL_FROM: z.string().min(3).default("Caddis <no-reply@caddis.invalid>"),
  MAIL_INBOX_URL: z.url().default("http://127.0.0.1:1080"),
  // Outbox delivery (lib/jobs/outbox-worker.ts): tries before a message is marked failed, the
  // first back-off (doubled after each failure, capped), the claim lease, the poll interval.
  MAIL_MAX_ATTEMPTS: z.coerce.number().int().min(1).max(50).default(8),
  MAIL_RETRY_BASE_SECONDS: z.coerce.number().min(0.01).max(86_400).default(60),
  MAIL_RETRY_MAX_SECONDS: z.coerce.number().min(0.01).max(86_400).default(3_600),
  MAIL_LEASE_SECONDS: z.coerce.number().min(1).max(3_600).default(300),
  MAIL_POLL_SECONDS: z.coerce.number().min(0.05).max(600).default(5),
  // A worker that delivers only keys with this prefix (e.g. "care-team-alert:" for an alert lane).
  MAIL_WORKER_KEY_PREFIX: z.string().default(""),
  // "off" keeps the outbox worker and schedules out of the Next.js process (run scripts/worker.ts).
  CADDIS_BACKGROUND: z.enum(["on", "off"]).default("on"),
  // When the care teams' weekly digest is queued (cron, in CADDIS_TIME_ZONE).
  DIGEST_CRON: z.string().min(9).default("0 7 * * 1"),
  // When patients' catheter-change reminders are queued (cron, in CADDIS_TIME_ZONE).
  REMINDER_CRON: z.string().min(9).default("0 9 * * *"),
  CADDIS_TIME_ZONE: z.string().min(1).default("Europe/London"),
  // When closed records past their retention period are removed (cron, in CADDIS_TIME_ZONE).
  RETENTION_CRON: z.string().min(9).default("30 2 * * *"),
  S3_ENDPOINT: z.url().default("http://127.0.0.1:4569"),
  // Address browsers use for presigned uploads, when it differs from S3_ENDPOINT.
  S3_PUBLIC_ENDPOINT: z.preprocess((v) => (v === "" ? undefined : v), z.url().optional()),
  S3_REGION: z.string().default("us-east-1"),
  S3_BUCKET: z.string().default("caddis-uploads"),
  S3_ACCESS_KEY_ID: z.string().default("S3RVER"),
  S3_SECRET_ACCESS_KEY: z.string().default("S3RVER"),
  S3_FORCE_PATH_STYLE: z
    .enum(["true", "false"])
    .default("true")
    .transform((v) => v === "true"),
  // The proxies (addresses and CIDR ranges, comma-separated) whose forwarding headers are
  // believed, and the header they append the client address to. With none, the client address
  // is the TCP peer and no header is read (lib/http/client-address.ts, scripts/server.ts).
  TRUSTED_PROXIES: z.string().default(""),
  CLIENT_IP_HEADER: z.string().trim().toLowerCase().min(1).default("x-forwarded-for"),
  // Salt for the hashed IP addresses kept in audit events and rate-limit keys.
  AUDIT_IP_SALT: z.string().min(8).default("caddis-local-ip-salt"),
  CADDIS_DATA_DIR: z.string().default(".data"),
  // Text messages (lib/sms): the SMS service's base URL (the local fake from scripts/services.ts
  // unless set), its key and secret, and the sender name or number.
  SMS_API_URL: z.url().default("http://127.0.0.1:4590"),
  SMS_API_KEY: z.string().min(1).default("caddis-local"),
  SMS_API_SECRET: z.string().min(1).default("caddis-local-secret"),
  SMS_FROM: z.string().min(1).max(15).default("Caddis"),
  // Web Push (lib/push): VAPID keys; when unset, lib/config/push.ts reads the pair that
  // scripts/services.ts made in CADDIS_DATA_DIR/vapid.json.
  VAPID_PUBLIC_KEY: z.string().min(20).optional(),
  VAPID_PRIVATE_KEY: z.string().min(20).optional(),
  VAPID_SUBJECT: z.string().min(8).default("mailto:no-reply@caddis.invalid"),
});

export type Env = z.infer<typeof schema>;

function load(): Env {
  const parsed = schema.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`);
    throw new Error(`Invalid environment:\n${lines.join("\n")}`);
  }
  return parsed.data;
}

export const env: Env = load();

/** The secret that signs session cookies; a fixed value only outside production. */
export function authSecret(): string {
  if (env.BETTER_AUTH_SECRET) return env.BETTER_AUTH_SECRET;
  if (env.NODE_ENV === "production" && process.env.NEXT_PHASE !== "phase-production-build") {
    throw new Error("BETTER_AUTH_SECRET must be set in production (npm start writes one to .data/).");
  }
  return "caddis-development-secret-not-for-production-use";
}
