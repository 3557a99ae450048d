// The caseload API on the demo data: who may call it (ASVS 8.2.1), what each filter returns,
// search, sort, pagination, and the CSV export of the filtered view (OWASP CSV injection).
import { and, desc, eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { GET as exportCsv } from "@/app/api/caseload/export/route";
import { GET as caseload } from "@/app/api/caseload/route";
import { POST as createPatient } from "@/app/api/patients/route";
import { db } from "@/db";
import { auditEvents, catheterEpisodes, organisations } from "@/db/schema";
import { planDates } from "@/lib/clinical";
import { dayIn, todayIso } from "@/lib/shared/time-zone";
import { clinicianInNewTeam, userIdByEmail, type ClinicianFixture } from "../support/fixtures";
import { call, demo, sessionFor } from "../support/http";

type Row = {
  patientId: string;
  name: string;
  healthRecordNumber: string;
  state: string | null;
  daysSinceInsertion: number | null;
  plannedChangeOn: string | null;
  reviewDueOn: string | null;
  latestCheckInLevel: string | null;
  awaitingTwoc: boolean;
};
type Page = { rows: Row[]; total: number; page: number; pageSize: number; today: string };

async function list(query = "", who: keyof typeof demo = "communityNurse"): Promise<Page> {
  const res = await call(caseload, `/api/caseload${query}`, { cookie: await sessionFor(who) });
  expect(res.status, await res.clone().text()).toBe(200);
  return res.json();
}
const names = (p: Page) => p.rows.map((r) => r.name);
const sorted = (xs: string[]) => [...xs].sort();

describe("GET /api/caseload — access", () => {
  it("401 for anonymous, 403 for patient, carer and admin", async () => {
    expect((await call(caseload, "/api/caseload")).status).toBe(401);
    for (const who of ["patient", "carer", "admin"] as const) {
      const res = await call(caseload, "/api/caseload", { cookie: await sessionFor(who) });
      expect(res.status, who).toBe(403);
    }
  });

  it("shows each clinician only the patients of their own organisations (ASVS 8.4.1)", async () => {
    expect(sorted(names(await list()))).toEqual(
      sorted(["Arthur Pell", "Halina Nowak", "Yusuf Haddad", "Maria Popescu", "Rosa Jiménez", "Imran Qureshi"]),
    );
    expect(names(await list("", "wardNurse"))).toEqual(["Maria Popescu"]);
    expect((await list("", "rowanNurse")).total).toBe(0);
  });

  it("writes a caseload.view audit event without the search text", async () => {
    await list("?q=nowak&filter=overdue");
    const nurse = await userIdByEmail(demo.communityNurse.email);
    const [event] = await db
      .select()
      .from(auditEvents)
      .where(and(eq(auditEvents.actorUserId, nurse), eq(auditEvents.action, "caseload.view")))
      .orderBy(desc(auditEvents.id))
      .limit(1);
    expect(event.details).toMatchObject({ filter: "overdue", searched: true });
    expect(JSON.stringify(event.details)).not.toMatch(/nowak/i);
  });

  it("400 with field errors for a bad query string", async () => {
    const cookie = await sessionFor("communityNurse");
    for (const [q, field] of [
      ["?pageSize=101", "pageSize"],
      ["?pageSize=0", "pageSize"],
      ["?page=0", "page"],
      ["?page=abc", "page"],
      ["?filter=everything", "filter"],
      ["?sort=dob", "sort"],
      ["?dir=up", "dir"],
      [`?q=${"x".repeat(101)}`, "q"],
    ] as const) {
      const res = await call(caseload, `/api/caseload${q}`, { cookie });
      expect(res.status, q).toBe(400);
      const body = await res.json();
      expect(body.error.code).toBe("validation_failed");
      expect(Object.keys(body.error.fields), q).toContain(field);
    }
  });
});

describe("GET /api/caseload — filters, search, sort, pages", () => {
  it("states agree with lib/clinical planDates for every demo episode", async () => {
    const page = await list("?pageSize=100");
    const team = await db.select({ id: organisations.id }).from(organisations).where(eq(organisations.name, "Harbourside Community Nursing Team"));
    expect(team).toHaveLength(1);
    for (const row of page.rows) {
      const [e] = await db
        .select()
        .from(catheterEpisodes)
        .where(and(eq(catheterEpisodes.patientId, row.patientId)))
        .orderBy(desc(catheterEpisodes.insertedAt))
        .limit(1);
      const plan = planDates(
        { insertedOn: dayIn(e.insertedAt), material: e.material, route: e.route, maxDwellDays: e.maxDwellDays ?? undefined },
        { today: page.today },
      );
      expect(row.plannedChangeOn, row.name).toBe(plan.change.date);
      expect(row.reviewDueOn, row.name).toBe(plan.review.date);
      expect(row.state, row.name).toBe(plan.state);
    }
  });

  it("overdue: every patient with a change or review date before today", async () => {
    // Demo: all but Maria Popescu (inserted 12 days ago, 28-day dwell) have a review date past.
    const page = await list("?filter=overdue");
    expect(sorted(names(page))).toEqual(sorted(["Arthur Pell", "Halina Nowak", "Yusuf Haddad", "Rosa Jiménez", "Imran Qureshi"]));
    expect(page.rows.every((r) => r.state === "overdue")).toBe(true);
  });

  it("due within 7 days: a change or review from today to 7 days ahead", async () => {
    // Demo: Arthur's change is due in 4 days, Imran's in 6 (84-day dwell, inserted 80 and 78 days ago).
    const page = await list("?filter=due-soon");
    expect(sorted(names(page))).toEqual(sorted(["Arthur Pell", "Imran Qureshi"]));
    for (const r of page.rows) {
      const days = (Date.parse(r.plannedChangeOn!) - Date.parse(page.today)) / 86_400_000;
      expect(days).toBeGreaterThanOrEqual(0);
      expect(days).toBeLessThanOrEqual(7);
    }
  });

  it("urgent check-ins: latest check-in urgent or emergency", async () => {
    const page = await list("?filter=urgent");
    expect(names(page)).toEqual(["Imran Qureshi"]);
    expect(page.rows[0].latestCheckInLevel).toBe("urgent");
  });

  it("awaiting trial without catheter", async () => {
    const page = await list("?filter=twoc");
    expect(names(page)).toEqual(["Maria Popescu"]);
    expect(page.rows[0].awaitingTwoc).toBe(true);
  });

  it("searches by name (either order, any case) or health record number, wildcards taken literally", async () => {
    expect(names(await list("?q=nowak"))).toEqual(["Halina Nowak"]);
    expect(names(await list("?q=Pell%20Arthur"))).toEqual(["Arthur Pell"]);
    expect(names(await list("?q=em-100-003"))).toEqual(["Yusuf Haddad"]);
    expect(names(await list("?q=JIM"))).toEqual(["Rosa Jiménez"]);
    expect((await list("?q=%25")).total).toBe(0);
    expect((await list("?q=_")).total).toBe(0);
    // Search and filter together.
    expect(names(await list("?q=pell&filter=due-soon"))).toEqual(["Arthur Pell"]);
    expect((await list("?q=popescu&filter=overdue")).total).toBe(0);
  });

  it("sorts by name, next change, review date and days since insertion, both ways", async () => {
    const byName = ["Yusuf Haddad", "Rosa Jiménez", "Halina Nowak", "Arthur Pell", "Maria Popescu", "Imran Qureshi"];
    expect(names(await list("?sort=name"))).toEqual(byName);
    expect(names(await list("?sort=name&dir=desc"))).toEqual([...byName].reverse());

    const change = await list("?sort=next-change");
    const dates = change.rows.map((r) => r.plannedChangeOn!);
    expect(dates).toEqual([...dates].sort());
    expect(change.rows[0].name).toBe("Rosa Jiménez");

    const review = await list("?sort=review&dir=desc");
    const reviews = review.rows.map((r) => r.reviewDueOn!);
    expect(reviews).toEqual([...reviews].sort().reverse());

    // Days since insertion: Maria 12, Yusuf 30, Halina 36, Imran 78, Arthur 80, Rosa 88.
    expect(names(await list("?sort=days-inserted"))).toEqual([
      "Maria Popescu",
      "Yusuf Haddad",
      "Halina Nowak",
      "Imran Qureshi",
      "Arthur Pell",
      "Rosa Jiménez",
    ]);
    const days = (await list("?sort=days-inserted&dir=desc")).rows.map((r) => r.daysSinceInsertion);
    expect(days).toEqual([88, 80, 78, 36, 30, 12]);
  });

  it("pages: boundaries, no overlap, and the total beyond the last page", async () => {
    const all = names(await list("?sort=name&pageSize=100"));
    const p1 = await list("?sort=name&pageSize=4&page=1");
    const p2 = await list("?sort=name&pageSize=4&page=2");
    const p3 = await list("?sort=name&pageSize=4&page=3");
    expect(p1.rows).toHaveLength(4);
    expect(p2.rows).toHaveLength(2);
    expect(p3.rows).toHaveLength(0);
    expect([p1.total, p2.total, p3.total]).toEqual([6, 6, 6]);
    expect([...names(p1), ...names(p2)]).toEqual(all);
    const one = await list("?sort=name&pageSize=1&page=6");
    expect(names(one)).toEqual(["Imran Qureshi"]);
    expect((await list("?pageSize=100")).pageSize).toBe(100);
  });
});

describe("GET /api/caseload/export", () => {
  let fixture: ClinicianFixture;
  beforeAll(async () => {
    fixture = await clinicianInNewTeam("Export");
    const gp = await db.select({ id: organisations.id }).from(organisations).where(eq(organisations.name, "Millbrook Surgery"));
    // Names a spreadsheet would run as formulas.
    for (const [given, family, hrn] of [
      ["=HYPERLINK(\"http://x.invalid\")", "Formula", "FX-0001"],
      ["+Plus", "@Mention", "FX-0002"],
      ["-Minus", "Comma, \"Quoted\"", "FX-0003"],
    ]) {
      const res = await call(createPatient, "/api/patients", {
        cookie: fixture.cookie,
        body: {
          givenName: given,
          familyName: family,
          healthRecordNumber: hrn,
          dateOfBirth: "1960-01-01",
          sex: "unknown",
          preferredLocale: "en",
          weightKg: null,
          allergies: { latex: "no", chlorhexidine: "no", lidocaine: "no", other: null },
          gpPracticeId: gp[0].id,
          careTeamOrganisationIds: [fixture.organisationId],
        },
      });
      expect(res.status, await res.clone().text()).toBe(201);
    }
  });
  afterAll(async () => {
    await fixture?.cleanup();
  });

  it("401 anonymous, 403 for patient, carer and admin", async () => {
    expect((await call(exportCsv, "/api/caseload/export")).status).toBe(401);
    for (const who of ["patient", "carer", "admin"] as const) {
      expect((await call(exportCsv, "/api/caseload/export", { cookie: await sessionFor(who) })).status).toBe(403);
    }
  });

  it("is a CSV attachment named by today's date, holding exactly the filtered rows in order", async () => {
    const res = await call(exportCsv, "/api/caseload/export?filter=overdue&sort=name", { cookie: await sessionFor("communityNurse") });
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toMatch(/^text\/csv/);
    expect(res.headers.get("content-disposition")).toBe(`attachment; filename="caseload-${todayIso()}.csv"`);
    expect(res.headers.get("cache-control")).toBe("no-store");
    const text = (await res.text()).replace(/^\uFEFF/, "");
    const lines = text.trimEnd().split("\r\n");
    expect(lines[0]).toMatch(/^Name,Health record number,/);
    const page = await list("?filter=overdue&sort=name&pageSize=100");
    expect(lines.slice(1).map((l) => l.split(",")[0])).toEqual(names(page));
    expect(lines.slice(1).map((l) => l.split(",")[1])).toEqual(page.rows.map((r) => r.healthRecordNumber));
  });

  it("neutralises cells that start with = + - @ and quotes commas and quotes", async () => {
    const res = await call(exportCsv, "/api/caseload/export?sort=name", { cookie: fixture.cookie });
    const text = (await res.text()).replace(/^\uFEFF/, "");
    const lines = text.trimEnd().split("\r\n");
    expect(lines).toHaveLength(4);
    expect(text).toContain(`"'=HYPERLINK(""http://x.invalid"") Formula"`);
    expect(text).toContain("'+Plus @Mention");
    expect(text).toContain(`"'-Minus Comma, ""Quoted"""`);
    for (const line of lines.slice(1)) expect(line).not.toMatch(/(^|,)[=+\-@]/);
  });

  it("exports in the requested language", async () => {
    const res = await call(exportCsv, "/api/caseload/export?locale=pl&filter=twoc", { cookie: await sessionFor("communityNurse") });
    const text = (await res.text()).replace(/^\uFEFF/, "");
    expect(text.split("\r\n")[0]).not.toMatch(/^Name,/);
    expect(text).toContain("Maria Popescu");
  });

  it("400 for a bad filter, like the list", async () => {
    const res = await call(exportCsv, "/api/caseload/export?filter=nope", { cookie: await sessionFor("communityNurse") });
    expect(res.status).toBe(400);
    expect((await res.json()).error.fields.filter).toBeDefined();
  });
});
