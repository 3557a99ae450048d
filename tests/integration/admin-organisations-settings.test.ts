// Organisations (create, read, edit; 404 across organisations) and deployment settings (the
// emergency number with no default hidden in code; intervals passed to lib/clinical planDates).
import { desc, eq } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";
import { GET as orgList, POST as orgCreate } from "@/app/api/admin/organisations/route";
import { GET as orgGet, PATCH as orgPatch } from "@/app/api/admin/organisations/[organisationId]/route";
import { GET as settingsGet, PATCH as settingsPatch } from "@/app/api/admin/settings/route";
import { POST as deactivate } from "@/app/api/admin/staff/[userId]/deactivate/route";
import { db } from "@/db";
import { auditEvents, memberships, organisations, settings, user } from "@/db/schema";
import { GET as caseloadGet } from "@/app/api/caseload/route";
import { POST as postInsertion } from "@/app/api/patients/[patientId]/episodes/route";
import { POST as createPatient } from "@/app/api/patients/route";
import { addDays } from "@/lib/clinical";
import { getEmergencyNumber, getRegion, getSettings, getTranslationReview } from "@/lib/config/settings";
import { dayIn, deploymentTimeZone } from "@/lib/shared/time-zone";
import { clinicianInNewTeam, demoDevice } from "../support/fixtures";
import { call, demo, sessionFor, signIn } from "../support/http";
import { createOrganisation, createStaff, orgIdsByName, suffix } from "../support/staff";

let admin: string;
let orgs: Record<string, string>;
beforeAll(async () => {
  admin = await sessionFor("admin");
  orgs = await orgIdsByName(["Larch Ward", "Millbrook Surgery", "Harbourside Community Nursing Team"]);
});

const newOrg = () => ({
  name: `Fernhill Surgery ${suffix()}`,
  kind: "gp_practice",
  phone: "01632 960 450",
  outOfHoursPhone: "",
  inboxEmail: "fernhill.surgery@eastmere.example",
  locale: "en",
  languages: ["en", "pl"],
  requireTwoFactor: true,
});

describe("organisations", () => {
  it("an admin creates a GP practice, becomes its member, and edits it; each change is audited", async () => {
    const body = newOrg();
    const res = await call(orgCreate, "/api/admin/organisations", { cookie: admin, body });
    expect(res.status).toBe(201);
    const { organisation } = await res.json();
    expect(organisation).toMatchObject({ name: body.name, kind: "gp_practice", outOfHoursPhone: null, languages: ["en", "pl"] });
    const adminId = (await db.select({ id: user.id }).from(user).where(eq(user.email, demo.admin.email)))[0].id;
    const member = await db.select().from(memberships).where(eq(memberships.organisationId, organisation.id));
    expect(member.map((m) => m.userId)).toEqual([adminId]);
    // The admin's next request sees it among their organisations.
    const list = await (await call(orgList, "/api/admin/organisations", { cookie: admin })).json();
    expect(list.organisations.map((o: { id: string }) => o.id)).toContain(organisation.id);

    const edit = await call(orgPatch, `/api/admin/organisations/${organisation.id}`, {
      method: "PATCH",
      cookie: admin,
      params: { organisationId: organisation.id },
      body: { phone: "01632 960 451", languages: ["en", "pl", "ar"] },
    });
    expect(edit.status).toBe(200);
    expect((await edit.json()).organisation).toMatchObject({ phone: "01632 960 451", languages: ["en", "pl", "ar"] });
    const events = await db.select().from(auditEvents).where(eq(auditEvents.organisationId, organisation.id));
    expect(events.map((e) => e.action).sort()).toEqual(["admin.organisation.create", "admin.organisation.update"]);
    expect(events.find((e) => e.action === "admin.organisation.update")!.details).toEqual({ changed: ["phone", "languages"] });
  });

  it("refuses bad input with every field error and writes nothing; a duplicate name of the same kind is a conflict", async () => {
    const before = await db.select({ id: organisations.id }).from(organisations);
    const res = await call(orgCreate, "/api/admin/organisations", {
      cookie: admin,
      body: { name: "X", kind: "pharmacy", phone: "call us", inboxEmail: "nope", locale: "fr", languages: [], requireTwoFactor: "yes" },
    });
    expect(res.status).toBe(400);
    const { error } = await res.json();
    expect(Object.keys(error.fields).sort()).toEqual(["inboxEmail", "kind", "languages", "locale", "name", "phone", "requireTwoFactor"]);
    expect(await db.select({ id: organisations.id }).from(organisations)).toHaveLength(before.length);
    const dup = await call(orgCreate, "/api/admin/organisations", { cookie: admin, body: { ...newOrg(), name: "Millbrook Surgery" } });
    expect(dup.status).toBe(409);
    expect((await dup.json()).error.fields.name).toEqual(["name_taken"]);
  });

  it("an admin of another organisation gets 404 for this one; an admin gets 404 for an organisation they are not a member of", async () => {
    const elsewhere = await createOrganisation({ name: `Elsewhere Ward ${suffix()}` });
    const other = await createStaff({ role: "admin", organisationIds: [elsewhere.id] });
    const cookie = await signIn(other.email, other.password);
    const larch = orgs["Larch Ward"];
    expect((await call(orgGet, `/api/admin/organisations/${larch}`, { cookie, params: { organisationId: larch } })).status).toBe(404);
    const patch = await call(orgPatch, `/api/admin/organisations/${larch}`, { method: "PATCH", cookie, params: { organisationId: larch }, body: { phone: "01632 960 000" } });
    expect(patch.status).toBe(404);
    const [row] = await db.select({ phone: organisations.phone }).from(organisations).where(eq(organisations.id, larch));
    expect(row.phone).toBe("01632 960 101");
    // Morgan manages Larch but not Millbrook Surgery.
    const mill = orgs["Millbrook Surgery"];
    expect((await call(orgGet, `/api/admin/organisations/${mill}`, { cookie: admin, params: { organisationId: mill } })).status).toBe(404);
    expect((await call(orgGet, "/api/admin/organisations/not-a-uuid", { cookie: admin, params: { organisationId: "not-a-uuid" } })).status).toBe(404);
  });

  it("a clinician or patient gets 403 on every organisation route", async () => {
    const larch = orgs["Larch Ward"];
    for (const who of ["wardNurse", "patient"] as const) {
      const cookie = await sessionFor(who);
      expect((await call(orgList, "/api/admin/organisations", { cookie })).status).toBe(403);
      expect((await call(orgCreate, "/api/admin/organisations", { cookie, body: newOrg() })).status).toBe(403);
      expect((await call(orgGet, `/api/admin/organisations/${larch}`, { cookie, params: { organisationId: larch } })).status).toBe(403);
      expect((await call(orgPatch, `/api/admin/organisations/${larch}`, { method: "PATCH", cookie, params: { organisationId: larch }, body: { phone: "01632 960 000" } })).status).toBe(403);
    }
  });
});

describe("admin home counts", () => {
  it("counts the active staff of each organisation: a deactivated member is not counted", async () => {
    const harbourside = orgs["Harbourside Community Nursing Team"];
    const countOf = async () => {
      const res = await call(orgList, "/api/admin/organisations", { cookie: admin });
      return (await res.json()).organisations.find((o: { id: string }) => o.id === harbourside).staffCount as number;
    };
    const before = await countOf();
    const member = await createStaff({ role: "clinician", organisationIds: [harbourside] });
    expect(await countOf()).toBe(before + 1);
    const off = await call(deactivate, `/api/admin/staff/${member.id}/deactivate`, { method: "POST", cookie: admin, params: { userId: member.id } });
    expect(off.status).toBe(200);
    expect(await countOf()).toBe(before);
  });
});

describe("deployment settings", () => {
  it("the seed sets 999 for the demo; an admin changes it; digits only", async () => {
    const res = await call(settingsGet, "/api/admin/settings", { cookie: admin });
    expect((await res.json()).settings.emergencyNumber).toBe("999");
    for (const bad of ["99 9", "999a", "9", "1234567", "+44999"]) {
      const r = await call(settingsPatch, "/api/admin/settings", { method: "PATCH", cookie: admin, body: { emergencyNumber: bad } });
      expect(r.status, bad).toBe(400);
      expect((await r.json()).error.fields.emergencyNumber).toEqual(["emergency_digits"]);
    }
    expect(await getEmergencyNumber()).toBe("999");
    const ok = await call(settingsPatch, "/api/admin/settings", { method: "PATCH", cookie: admin, body: { emergencyNumber: "112" } });
    expect(ok.status).toBe(200);
    expect(await getEmergencyNumber()).toBe("112");
    const [event] = await db.select().from(auditEvents).where(eq(auditEvents.action, "admin.settings.update"));
    expect(event.details).toEqual({ changes: { emergencyNumber: { from: "999", to: "112" } } });
    await call(settingsPatch, "/api/admin/settings", { method: "PATCH", cookie: admin, body: { emergencyNumber: "999" } });
  });

  it("an emergency number that is not configured reads as null, never as a default from code", async () => {
    expect(await getEmergencyNumber()).toBe("999");
    await db.delete(settings).where(eq(settings.key, "emergencyNumber"));
    try {
      expect(await getEmergencyNumber()).toBeNull();
      // A stored value that is not digits (say, edited by hand) is not shown either.
      await db.insert(settings).values({ key: "emergencyNumber", value: "nine-nine-nine" });
      expect(await getEmergencyNumber()).toBeNull();
    } finally {
      await db.delete(settings).where(eq(settings.key, "emergencyNumber"));
      await db.insert(settings).values({ key: "emergencyNumber", value: "999" });
    }
  });

  it("the planning settings reach the episodes and the caseload: a change of setting, read through the routes", async () => {
    // A team of its own, so the caseload holds only this test's patient.
    const team = await clinicianInNewTeam("Settings");
    try {
      const [gp] = await db.select({ id: organisations.id }).from(organisations).where(eq(organisations.kind, "gp_practice")).limit(1);
      const reg = await call(createPatient, "/api/patients", {
        cookie: team.cookie,
        body: {
          givenName: "Setta", familyName: `Ingham ${suffix()}`, healthRecordNumber: `ST-${suffix().slice(0, 8).toUpperCase()}`, dateOfBirth: "1950-02-03",
          sex: "female", preferredLocale: "en", weightKg: null, allergies: { latex: "no", chlorhexidine: "no", lidocaine: "no", other: null },
          gpPracticeId: gp.id, careTeamOrganisationIds: [team.organisationId],
        },
      });
      expect(reg.status, await reg.clone().text()).toBe(201);
      const patientId = (await reg.json()).patient.id as string;
      const set = (body: Record<string, unknown>) => call(settingsPatch, "/api/admin/settings", { method: "PATCH", cookie: admin, body });
      expect((await set({ reviewIntervalDays: 14, dueSoonDays: 3, defaultMaxDwellDays: { "all-silicone": 56 } })).status).toBe(200);

      // Inserted 51 days ago with no maker's figure: the admin's 56 days put the change 5 days ahead.
      const insertedAt = new Date(Date.now() - 51 * 86_400_000);
      const ins = await call(postInsertion, `/api/patients/${patientId}/episodes`, {
        cookie: team.cookie,
        params: { patientId },
        body: { ...demoDevice, material: "all-silicone", indication: "Chronic urinary retention", insertedAt: insertedAt.toISOString(), gelKind: "plain", gelVolumeMl: 11, attempts: 1, lot: "AB12", expiry: "2030-01-31", overrides: [] },
      });
      expect(ins.status, await ins.clone().text()).toBe(201);
      const { episode } = await ins.json();
      const insertedOn = dayIn(insertedAt, deploymentTimeZone());
      expect(episode.plannedChangeOn).toBe(addDays(insertedOn, 56));
      expect(episode.reviewDueOn).toBe(addDays(insertedOn, 14));

      const caseload = async (filter?: string) => {
        const res = await call(caseloadGet, `/api/caseload${filter ? `?filter=${filter}` : ""}`, { cookie: team.cookie });
        expect(res.status).toBe(200);
        return res.json();
      };
      // Five days ahead is not due soon with a 3-day window (the review, 14 days after insertion, is long overdue).
      const all = await caseload();
      expect(all.dueSoonDays).toBe(3);
      expect(all.rows.map((r: { changeState: string }) => r.changeState)).toEqual(["ok"]);
      expect((await caseload("due-soon")).total).toBe(0);
      // Widened to 7 days by the admin, the same change is due soon: the caseload follows at once.
      expect((await set({ dueSoonDays: 7 })).status).toBe(200);
      const wider = await caseload("due-soon");
      expect(wider.total).toBe(1);
      expect(wider.rows[0].changeState).toBe("due-soon");
    } finally {
      await call(settingsPatch, "/api/admin/settings", { method: "PATCH", cookie: admin, body: { reviewIntervalDays: null, dueSoonDays: null, defaultMaxDwellDays: null } });
      await team.cleanup();
    }
  });

  it("refuses unknown keys and out-of-range values; clinicians and patients get 403", async () => {
    const unknown = await call(settingsPatch, "/api/admin/settings", { method: "PATCH", cookie: admin, body: { secretKnob: 1 } });
    expect(unknown.status).toBe(400);
    const range = await call(settingsPatch, "/api/admin/settings", { method: "PATCH", cookie: admin, body: { retentionDays: 2, reviewIntervalDays: 1.5 } });
    expect(Object.keys((await range.json()).error.fields).sort()).toEqual(["retentionDays", "reviewIntervalDays"]);
    for (const who of ["communityNurse", "carer"] as const) {
      const cookie = await sessionFor(who);
      expect((await call(settingsGet, "/api/admin/settings", { cookie })).status).toBe(403);
      expect((await call(settingsPatch, "/api/admin/settings", { method: "PATCH", cookie, body: { emergencyNumber: "111" } })).status).toBe(403);
    }
    expect(await getEmergencyNumber()).toBe("999");
  });

  it("the region for dates is a setting: a two-letter code, kept upper-case; anything else is refused and changes nothing", async () => {
    const bad = await call(settingsPatch, "/api/admin/settings", { method: "PATCH", cookie: admin, body: { region: "GBR" } });
    expect(bad.status).toBe(400);
    expect((await bad.json()).error.fields.region).toEqual(["region_code"]);
    expect(await getRegion()).toBe("GB");
    const ok = await call(settingsPatch, "/api/admin/settings", { method: "PATCH", cookie: admin, body: { region: "ie" } });
    expect(ok.status).toBe(200);
    expect(await getRegion()).toBe("IE");
    await call(settingsPatch, "/api/admin/settings", { method: "PATCH", cookie: admin, body: { region: "GB" } });
    expect(await getRegion()).toBe("GB");
  });

  it("an admin records who reviewed a language's patient texts and when; bad input is refused and writes nothing", async () => {
    const bad = await call(settingsPatch, "/api/admin/settings", {
      method: "PATCH",
      cookie: admin,
      body: { translationReviews: { pl: { reviewerName: "A", reviewedOn: "2999-01-01" }, en: { reviewerName: "Nobody", reviewedOn: "2026-01-01" } } },
    });
    expect(bad.status).toBe(400);
    expect((await getSettings()).translationReviews).toEqual({});
    const ok = await call(settingsPatch, "/api/admin/settings", {
      method: "PATCH",
      cookie: admin,
      body: { translationReviews: { pl: { reviewerName: "Anna Test-Reviewer", reviewedOn: "2026-11-20" } } },
    });
    expect(ok.status).toBe(200);
    expect(await getTranslationReview("pl")).toEqual({ reviewerName: "Anna Test-Reviewer", reviewedOn: "2026-11-20" });
    expect(await getTranslationReview("ar")).toBeNull();
    const [event] = await db
      .select()
      .from(auditEvents)
      .where(eq(auditEvents.action, "admin.settings.update"))
      .orderBy(desc(auditEvents.at))
      .limit(1);
    expect(JSON.stringify(event.details)).toContain("Anna Test-Reviewer");
    // Withdrawn (e.g. after the texts change): the caution comes back.
    await call(settingsPatch, "/api/admin/settings", { method: "PATCH", cookie: admin, body: { translationReviews: null } });
    expect(await getTranslationReview("pl")).toBeNull();
  });
});
