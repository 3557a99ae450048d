/**
 * The invented Eastmere demo: one hospital (wards Larch and Rowan), a community nursing team,
 * two GP practices, staff, patients with different catheter histories, a carer. Idempotent:
 * running it again changes nothing that is already there. Prints the demo accounts.
 * Every name, number and address here is invented; 01632 960xxx is a range set aside for fiction.
 */
// Run with tsx outside Next.js: the server modules it loads say "server-only" (see the shim).
import "../scripts/server-only-shim.cjs";
import { randomUUID } from "node:crypto";
import path from "node:path";
import { fileURLToPath } from "node:url";
import { and, eq, sql } from "drizzle-orm";
import { db, pool, type Database, type Executor } from "./index";
import {
  account,
  careTeam,
  carerLinks,
  catheterEpisodes,
  episodeEvents,
  memberships,
  organisations,
  patients,
  checkIns,
  diaryEntries,
  settings,
  twoFactor,
  user,
  type NewCatheterEpisode,
  type OrganisationKind,
} from "./schema";
import { symmetricDecrypt, symmetricEncrypt } from "better-auth/crypto";
import { hashPassword } from "@/lib/auth/password";
import { authSecret } from "@/lib/config/env";
import { planDates, triageCheckIn, type AllergyAnswer, type CheckInAnswers } from "@/lib/clinical";

type Role = "admin" | "clinician" | "patient" | "carer";

export const demoAccounts: { email: string; password: string; name: string; role: Role; orgs: string[]; locale: string; note: string }[] = [
  { email: "admin@eastmere.example", password: "Eastmere-admin-2026", name: "Morgan Hale", role: "admin", orgs: ["Larch Ward", "Rowan Ward", "Harbourside Community Nursing Team"], locale: "en", note: "organisation admin" },
  { email: "ward.nurse@eastmere.example", password: "Eastmere-ward-2026", name: "Tomasz Reid", role: "clinician", orgs: ["Larch Ward"], locale: "en", note: "discharge nurse, Larch Ward" },
  { email: "community.nurse@eastmere.example", password: "Eastmere-community-2026", name: "Grace Mensah", role: "clinician", orgs: ["Harbourside Community Nursing Team"], locale: "en", note: "district nurse, Harbourside" },
  { email: "rowan.nurse@eastmere.example", password: "Eastmere-rowan-2026", name: "Priya Sandhu", role: "clinician", orgs: ["Rowan Ward"], locale: "en", note: "clinician of another team (visiting)" },
  { email: "arthur.pell@eastmere.example", password: "Eastmere-patient-2026", name: "Arthur Pell", role: "patient", orgs: [], locale: "en", note: "patient, latex allergy" },
  { email: "yusuf.haddad@eastmere.example", password: "Eastmere-patient-ar-2026", name: "Yusuf Haddad", role: "patient", orgs: [], locale: "ar", note: "patient, suprapubic, Arabic" },
  { email: "joan.pell@eastmere.example", password: "Eastmere-carer-2026", name: "Joan Pell", role: "carer", orgs: [], locale: "en", note: "carer of Arthur Pell" },
];

/**
 * Two-step sign-in for the demo's staff (required of every member of staff by default), so
 * demos and tests can compute their codes. Invented secrets for this demo only: the raw key
 * (better-auth keeps it as text) and its base32 form, which an authenticator app is given.
 * Patients and carers may turn it on themselves; the demo ones have not.
 */
export type DemoTotp = { email: string; key: string; base32: string; backupCodes: readonly string[] };

const backupCodes = (prefix: string) => Array.from({ length: 10 }, (_, i) => `${prefix}-${String(i + 1).padStart(5, "0")}`);

export const DEMO_STAFF_TOTP: readonly DemoTotp[] = [
  { email: "admin@eastmere.example", key: "eastmere-demo-admin-totp-key-026", base32: "MVQXG5DNMVZGKLLEMVWW6LLBMRWWS3RNORXXI4BNNNSXSLJQGI3A", backupCodes: backupCodes("DEMOA") },
  { email: "ward.nurse@eastmere.example", key: "eastmere-demo-ward-totp-key-0263", base32: "MVQXG5DNMVZGKLLEMVWW6LLXMFZGILLUN52HALLLMV4S2MBSGYZQ", backupCodes: backupCodes("DEMOW") },
  { email: "community.nurse@eastmere.example", key: "eastmere-demo-comm-totp-key-0264", base32: "MVQXG5DNMVZGKLLEMVWW6LLDN5WW2LLUN52HALLLMV4S2MBSGY2A", backupCodes: backupCodes("DEMOC") },
  { email: "rowan.nurse@eastmere.example", key: "eastmere-demo-rown-totp-key-0265", base32: "MVQXG5DNMVZGKLLEMVWW6LLSN53W4LLUN52HALLLMV4S2MBSGY2Q", backupCodes: backupCodes("DEMOR") },
];

export const DEMO_ADMIN_TOTP = DEMO_STAFF_TOTP[0]!;

/**
 * Gives an account a TOTP secret and backup codes, as better-auth's two-factor plugin keeps them
 * (encrypted with the auth secret), re-encrypted if that secret has changed. Demo and test
 * accounts only: real people enrol with their own app.
 */
export async function enrolTotp(tx: Executor, userId: string, totp: Pick<DemoTotp, "key" | "backupCodes">) {
  const key = authSecret();
  const [row] = await tx.select().from(twoFactor).where(eq(twoFactor.userId, userId));
  const readable = row ? await symmetricDecrypt({ key, data: row.secret }).catch(() => null) : null;
  const codes = row ? await symmetricDecrypt({ key, data: row.backupCodes }).catch(() => null) : null;
  if (row && row.verified && readable === totp.key && codes === JSON.stringify(totp.backupCodes)) return;
  const values = {
    secret: await symmetricEncrypt({ key, data: totp.key }),
    backupCodes: await symmetricEncrypt({ key, data: JSON.stringify(totp.backupCodes) }),
    verified: true,
    failedVerificationCount: 0,
    lockedUntil: null,
  };
  if (row) await tx.update(twoFactor).set(values).where(eq(twoFactor.id, row.id));
  else await tx.insert(twoFactor).values({ id: randomUUID(), userId, ...values });
  await tx.update(user).set({ twoFactorEnabled: true }).where(eq(user.id, userId));
}

const orgs: { name: string; kind: OrganisationKind; parentName?: string; phone: string; outOfHoursPhone?: string; inboxEmail: string; locale: string; languages: string[] }[] = [
  { name: "Larch Ward", kind: "hospital_ward", parentName: "Eastmere General Hospital", phone: "01632 960 101", inboxEmail: "larch.ward@eastmere.example", locale: "en", languages: ["en", "pl", "ro", "ar", "ur", "es"] },
  { name: "Rowan Ward", kind: "hospital_ward", parentName: "Eastmere General Hospital", phone: "01632 960 102", inboxEmail: "rowan.ward@eastmere.example", locale: "en", languages: ["en", "pl", "ro", "ar", "ur", "es"] },
  { name: "Harbourside Community Nursing Team", kind: "community_team", phone: "01632 960 210", outOfHoursPhone: "01632 960 299", inboxEmail: "harbourside.team@eastmere.example", locale: "en", languages: ["en", "pl", "ro", "ar", "ur", "es"] },
  { name: "Millbrook Surgery", kind: "gp_practice", phone: "01632 960 310", inboxEmail: "millbrook.surgery@eastmere.example", locale: "en", languages: ["en"] },
  { name: "Quayside Practice", kind: "gp_practice", phone: "01632 960 320", inboxEmail: "quayside.practice@eastmere.example", locale: "en", languages: ["en"] },
];

function daysFromToday(days: number, today = new Date()): Date {
  const d = new Date(today);
  d.setUTCHours(10, 0, 0, 0);
  d.setUTCDate(d.getUTCDate() + days);
  return d;
}
const isoDate = (d: Date) => d.toISOString().slice(0, 10);

async function upsertOrganisation(tx: Database, o: (typeof orgs)[number]) {
  const [row] = await tx
    .insert(organisations)
    .values({ ...o, parentName: o.parentName ?? null, outOfHoursPhone: o.outOfHoursPhone ?? null })
    .onConflictDoNothing({ target: [organisations.name, organisations.kind] })
    .returning({ id: organisations.id });
  if (row) return row.id;
  const [found] = await tx
    .select({ id: organisations.id })
    .from(organisations)
    .where(and(eq(organisations.name, o.name), eq(organisations.kind, o.kind)));
  return found.id;
}

async function upsertUser(tx: Database, a: (typeof demoAccounts)[number]) {
  const [existing] = await tx.select({ id: user.id }).from(user).where(eq(user.email, a.email));
  if (existing) return existing.id;
  const id = randomUUID();
  await tx.insert(user).values({ id, email: a.email, name: a.name, role: a.role, locale: a.locale, emailVerified: true });
  await tx.insert(account).values({
    id: randomUUID(),
    userId: id,
    accountId: id,
    providerId: "credential",
    password: await hashPassword(a.password),
  });
  return id;
}

type DemoPatient = {
  hrn: string;
  givenName: string;
  familyName: string;
  dateOfBirth: string;
  sex: "female" | "male";
  locale: string;
  weightKg: number;
  /** Answers as recorded; an allergen left out was asked about: "no". */
  allergies?: { latex?: AllergyAnswer; chlorhexidine?: AllergyAnswer; lidocaine?: AllergyAnswer; other?: string };
  gp: string;
  team: string[];
  account?: string;
  episodes: (Omit<NewCatheterEpisode, "patientId" | "insertedAt" | "plannedChangeOn" | "reviewDueOn" | "insertedByName" | "indication"> & {
    insertedDaysAgo: number;
    dwellDays: number;
    removedDaysAgo?: number;
    unplannedReason?: "blockage" | "bypassing" | "expelled" | "infection" | "other";
    indication?: string;
    by: string;
    org: string;
  })[];
};

const silicone14 = {
  route: "urethral" as const,
  catheterType: "two-way" as const,
  material: "all-silicone" as const,
  lengthCategory: "standard" as const,
  sizeCh: 14,
  balloonMl: 10,
  makerBalloonMl: 10,
  maker: "Northfen Medical (demo)",
  gelKind: "plain" as const,
  gelVolumeMl: 11,
};

// Halina's catheters block after about three weeks; her history shows it.
const halinaEpisodes: DemoPatient["episodes"] = [120, 99, 78, 57, 36].map((ago, i, all) => ({
  ...silicone14,
  material: "hydrogel-coated-latex" as const,
  lengthCategory: "female" as const,
  gelVolumeMl: 6,
  lot: `HN${2400 + i}`,
  expiry: isoDate(daysFromToday(500)),
  insertedDaysAgo: ago,
  dwellDays: 84,
  removedDaysAgo: i < all.length - 1 ? all[i + 1] : undefined,
  unplannedReason: i < all.length - 1 ? ("blockage" as const) : undefined,
  indication: "Chronic urinary retention",
  by: "Grace Mensah",
  org: "Harbourside Community Nursing Team",
}));

export const demoPatients: DemoPatient[] = [
  {
    hrn: "EM-100-001",
    givenName: "Arthur",
    familyName: "Pell",
    dateOfBirth: "1944-03-12",
    sex: "male",
    locale: "en",
    weightKg: 74,
    allergies: { latex: "yes" },
    gp: "Millbrook Surgery",
    team: ["Harbourside Community Nursing Team"],
    account: "arthur.pell@eastmere.example",
    episodes: [
      { ...silicone14, lot: "AP7731", expiry: isoDate(daysFromToday(400)), insertedDaysAgo: 80, dwellDays: 84, indication: "Chronic urinary retention, not suitable for intermittent catheterisation", by: "Grace Mensah", org: "Harbourside Community Nursing Team" },
    ],
  },
  {
    hrn: "EM-100-002",
    givenName: "Halina",
    familyName: "Nowak",
    dateOfBirth: "1950-09-02",
    sex: "female",
    locale: "pl",
    weightKg: 63,
    gp: "Quayside Practice",
    team: ["Harbourside Community Nursing Team"],
    episodes: halinaEpisodes,
  },
  {
    hrn: "EM-100-003",
    givenName: "Yusuf",
    familyName: "Haddad",
    dateOfBirth: "1958-01-20",
    sex: "male",
    locale: "ar",
    weightKg: 81,
    allergies: { chlorhexidine: "yes" },
    gp: "Millbrook Surgery",
    team: ["Harbourside Community Nursing Team"],
    account: "yusuf.haddad@eastmere.example",
    episodes: [
      { ...silicone14, route: "suprapubic", sizeCh: 16, gelKind: "plain", lot: "YH5520", expiry: isoDate(daysFromToday(300)), insertedDaysAgo: 30, dwellDays: 84, indication: "Neurogenic bladder; urethral route not suitable", by: "Grace Mensah", org: "Harbourside Community Nursing Team" },
    ],
  },
  {
    hrn: "EM-100-004",
    givenName: "Maria",
    familyName: "Popescu",
    dateOfBirth: "1955-06-30",
    sex: "female",
    locale: "ro",
    weightKg: 68,
    gp: "Quayside Practice",
    team: ["Larch Ward", "Harbourside Community Nursing Team"],
    // Transferred from the ward in a hurry: nobody has asked about latex yet, so the checks warn
    // ("not recorded: ask first") and every record, card and letter says "not recorded".
    allergies: { latex: "not-asked" },
    episodes: [
      { ...silicone14, lengthCategory: "female", gelVolumeMl: 6, material: "ptfe-coated-latex", lot: "MP1180", expiry: isoDate(daysFromToday(200)), insertedDaysAgo: 12, dwellDays: 28, awaitingTwoc: true, twocPlannedOn: isoDate(daysFromToday(9)), twocMedicineNote: "Tamsulosin 400 micrograms daily from 3 days before the trial, as prescribed (demo)", indication: "Acute urinary retention after surgery", by: "Tomasz Reid", org: "Larch Ward" },
    ],
  },
  {
    hrn: "EM-100-005",
    givenName: "Rosa",
    familyName: "Jiménez",
    dateOfBirth: "1967-11-08",
    sex: "female",
    locale: "es",
    weightKg: 70,
    gp: "Millbrook Surgery",
    team: ["Harbourside Community Nursing Team"],
    episodes: [
      { ...silicone14, lengthCategory: "female", gelVolumeMl: 6, lot: "RJ3302", expiry: isoDate(daysFromToday(20)), insertedDaysAgo: 88, dwellDays: 84, indication: "Intractable incontinence with skin breakdown", by: "Grace Mensah", org: "Harbourside Community Nursing Team" },
    ],
  },
  {
    hrn: "EM-100-006",
    givenName: "Imran",
    familyName: "Qureshi",
    dateOfBirth: "1946-04-15",
    sex: "male",
    locale: "ur",
    weightKg: 66,
    allergies: { lidocaine: "yes" },
    gp: "Quayside Practice",
    team: ["Harbourside Community Nursing Team"],
    episodes: [
      { ...silicone14, sizeCh: 16, gelKind: "plain", lot: "IQ9021", expiry: isoDate(daysFromToday(600)), insertedDaysAgo: 78, dwellDays: 84, indication: "Bladder outflow obstruction awaiting surgery", by: "Grace Mensah", org: "Harbourside Community Nursing Team" },
    ],
  },
];

// Reports from home for patients without a portal account of their own (the team took them by
// phone): Imran's urgent one puts him on the caseload's urgent filter; Halina keeps a diary.
// Levels come from lib/clinical's triage, never typed in by hand.
const demoReports: { hrn: string; key: string; hoursAgo: number; answers: CheckInAnswers }[] = [
  { hrn: "EM-100-006", key: "seed-check-in-imran-1", hoursAgo: 3, answers: { draining: "less", pain: "severe" } },
  { hrn: "EM-100-002", key: "seed-check-in-halina-1", hoursAgo: 5 * 24, answers: { draining: "less", pain: "mild" } },
  { hrn: "EM-100-002", key: "seed-check-in-halina-2", hoursAgo: 26, answers: { draining: "yes", pain: "none", sediment: true } },
];

async function seedReports(tx: Database) {
  const latest = new Map<string, { level: string; at: Date }>();
  for (const r of demoReports) {
    const [p] = await tx.select({ id: patients.id }).from(patients).where(eq(patients.healthRecordNumber, r.hrn));
    if (!p) continue;
    const result = triageCheckIn(r.answers);
    const at = new Date(Date.now() - r.hoursAgo * 3_600_000);
    const [row] = await tx
      .insert(checkIns)
      .values({ patientId: p.id, answers: { ...r.answers }, level: result.level, ruleIds: result.ruleIds, idempotencyKey: r.key, createdAt: at, updatedAt: at })
      .onConflictDoNothing({ target: checkIns.idempotencyKey })
      .returning({ id: checkIns.id });
    if (!row) continue; // already seeded
    const prev = latest.get(p.id);
    if (!prev || prev.at < at) latest.set(p.id, { level: result.level, at });
    if (r.key === "seed-check-in-halina-1") {
      // Three days of drinks and bag emptying, at fixed hours of each day.
      const entries: { kind: "in" | "out"; volumeMl: number; hour: number }[] = [
        { kind: "in", volumeMl: 250, hour: 8 },
        { kind: "in", volumeMl: 200, hour: 11 },
        { kind: "out", volumeMl: 400, hour: 12 },
        { kind: "in", volumeMl: 300, hour: 14 },
        { kind: "in", volumeMl: 250, hour: 18 },
        { kind: "out", volumeMl: 350, hour: 19 },
      ];
      for (const daysAgo of [1, 2, 3]) {
        await tx.insert(diaryEntries).values(
          entries.map((e, i) => {
            const when = daysFromToday(-daysAgo);
            when.setUTCHours(e.hour, 0, 0, 0);
            return { patientId: p.id, kind: e.kind, volumeMl: e.volumeMl + (daysAgo === 2 && i === 2 ? -100 : 0), at: when };
          }),
        );
      }
    }
  }
  for (const [id, { level, at }] of latest) {
    await tx
      .update(patients)
      .set({ latestCheckInLevel: level as "urgent", latestCheckInAt: at })
      .where(eq(patients.id, id));
  }
}

export async function seed({ quiet = false }: { quiet?: boolean } = {}) {
  const orgIds = new Map<string, string>();
  const userIds = new Map<string, string>();
  await db.transaction(async (tx) => {
    const t = tx as unknown as Database;
    for (const o of orgs) orgIds.set(o.name, await upsertOrganisation(t, o));
    for (const a of demoAccounts) {
      const id = await upsertUser(t, a);
      userIds.set(a.email, id);
      const totp = DEMO_STAFF_TOTP.find((x) => x.email === a.email);
      if (totp) await enrolTotp(t, id, totp);
      for (const org of a.orgs) {
        await tx.insert(memberships).values({ userId: id, organisationId: orgIds.get(org)! }).onConflictDoNothing();
      }
    }
    await tx
      .insert(settings)
      .values([
        { key: "emergencyNumber", value: "999" },
        // Dates as written in the UK: 3 December 2026, 24-hour clock.
        { key: "region", value: "GB" },
        { key: "outOfHoursServiceName", value: "Eastmere out-of-hours nursing line" },
        // Invented, in the range set aside for drama; shown where a lead team has no out-of-hours number.
        { key: "outOfHoursPhone", value: "01632 960 999" },
        // Adult records: 8 years after the end of care (from memory of the NHS England records code of practice).
        { key: "retentionDays", value: 8 * 365 },
      ])
      .onConflictDoNothing();

    const nameToUser = new Map(demoAccounts.map((a) => [a.name, userIds.get(a.email)!]));
    for (const p of demoPatients) {
      const [inserted] = await tx
        .insert(patients)
        .values({
          healthRecordNumber: p.hrn,
          givenName: p.givenName,
          familyName: p.familyName,
          dateOfBirth: p.dateOfBirth,
          sex: p.sex,
          preferredLocale: p.locale,
          weightKg: p.weightKg,
          allergyLatex: p.allergies?.latex ?? "no",
          allergyChlorhexidine: p.allergies?.chlorhexidine ?? "no",
          allergyLidocaine: p.allergies?.lidocaine ?? "no",
          allergyOther: p.allergies?.other ?? null,
          gpPracticeId: orgIds.get(p.gp)!,
          userId: p.account ? userIds.get(p.account)! : null,
        })
        .onConflictDoNothing({ target: patients.healthRecordNumber })
        .returning({ id: patients.id });
      if (!inserted) continue; // already seeded
      const patientId = inserted.id;
      // The first team named leads (its numbers are the patient's to call).
      for (const [i, team] of p.team.entries()) {
        await tx.insert(careTeam).values({ patientId, organisationId: orgIds.get(team)!, lead: i === 0 }).onConflictDoNothing();
      }
      let previous: string | null = null;
      let previousUnplanned: DemoPatient["episodes"][number]["unplannedReason"];
      for (const e of p.episodes) {
        const { insertedDaysAgo, dwellDays, removedDaysAgo, unplannedReason, by, org, indication, ...device } = e;
        const insertedAt = daysFromToday(-insertedDaysAgo);
        const removedAt = removedDaysAgo !== undefined ? daysFromToday(-removedDaysAgo) : null;
        const [ep]: { id: string }[] = await tx
          .insert(catheterEpisodes)
          .values({
            ...device,
            patientId,
            previousEpisodeId: previous,
            organisationId: orgIds.get(org)!,
            indication: indication ?? "Chronic urinary retention",
            insertedAt,
            insertedByUserId: nameToUser.get(by) ?? null,
            insertedByName: by,
            maxDwellDays: dwellDays,
            // Dates from the same rules the episode forms use.
            ...(() => {
              const plan = planDates({ insertedOn: isoDate(insertedAt), material: device.material, route: device.route, maxDwellDays: dwellDays });
              return { plannedChangeOn: plan.change.date, reviewDueOn: plan.review.date };
            })(),
            residualUrineMl: 150,
            removedAt,
            removalReason: removedAt ? (unplannedReason ?? "planned change") : null,
          })
          .returning({ id: catheterEpisodes.id });
        await tx.insert(episodeEvents).values({
          episodeId: ep.id,
          patientId,
          kind: !previous ? "insertion" : previousUnplanned ? "unplanned_change" : "planned_change",
          reason: previous && previousUnplanned ? previousUnplanned : null,
          occurredAt: insertedAt,
          recordedByUserId: nameToUser.get(by) ?? null,
          recordedByName: by,
          organisationId: orgIds.get(org)!,
        });
        previous = ep.id;
        previousUnplanned = unplannedReason;
      }
    }
    await seedReports(t);
    const arthur = await tx.select({ id: patients.id }).from(patients).where(eq(patients.healthRecordNumber, "EM-100-001"));
    const joan = userIds.get("joan.pell@eastmere.example")!;
    const [link] = await tx
      .select({ id: carerLinks.id })
      .from(carerLinks)
      .where(and(eq(carerLinks.patientId, arthur[0].id), eq(carerLinks.carerUserId, joan)));
    if (!link) {
      await tx.insert(carerLinks).values({
        patientId: arthur[0].id,
        carerUserId: joan,
        invitedEmail: "joan.pell@eastmere.example",
        invitedByUserId: userIds.get("arthur.pell@eastmere.example")!,
        status: "active",
        acceptedAt: new Date(),
      });
    }
  });
  if (!quiet) printAccounts();
  return { orgIds, userIds };
}

export function printAccounts() {
  const url = process.env.APP_URL ?? "http://localhost:3000";
  console.log(`\nCaddis demo (invented Eastmere scenario) — sign in at ${url}/en/sign-in\n`);
  const w = Math.max(...demoAccounts.map((a) => a.email.length));
  for (const a of demoAccounts) {
    console.log(`  ${a.role.padEnd(9)} ${a.email.padEnd(w)}  ${a.password.padEnd(26)} ${a.note}`);
  }
  console.log("\n  Two-step sign-in (TOTP): add a secret to any authenticator app, or use a backup code once.");
  for (const x of DEMO_STAFF_TOTP) {
    console.log(`    ${x.email.padEnd(w)}  secret ${x.base32}  backup code ${x.backupCodes[0]}`);
    console.log(`      otpauth://totp/Caddis:${encodeURIComponent(x.email)}?secret=${x.base32}&issuer=Caddis`);
  }
  console.log("    (each backup code works once; the seed restores them)");
  console.log("");
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  seed()
    .then(async () => {
      const [{ n }] = await db.select({ n: sql<number>`count(*)::int` }).from(patients);
      console.log(`[seed] done: ${n} patients`);
      await pool.end();
    })
    .catch(async (e) => {
      console.error("[seed] failed:", e);
      await pool.end();
      process.exit(1);
    });
}
