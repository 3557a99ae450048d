// Patient-facing e-mails come in the patient's language; one-time codes and links do not stay
// readable in the record once sent, and such a message is never resent.
import { eq } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { POST as resendRoute } from "@/app/api/patients/[patientId]/messages/[messageId]/resend/route";
import { db } from "@/db";
import { listPatientMessages } from "@/db/queries/outbox";
import { outboundMessages, patients } from "@/db/schema";
import { queueCarerInvitation, queuePatientInvitation } from "@/lib/email/patient-mail";
import { drainOutbox } from "@/lib/jobs/outbox-worker";
import { call, sessionFor } from "../support/http";
import { mailPatient, waitForEmails, type MailFixture } from "../support/mail";

const quiet = () => {};
const resend = resendRoute as unknown as Parameters<typeof call>[0];
let fx: MailFixture;

beforeAll(async () => {
  fx = await mailPatient({ givenName: "Halina", familyName: "Invite-Test" });
  await db.update(patients).set({ preferredLocale: "pl" }).where(eq(patients.id, fx.patientId));
});
afterAll(async () => {
  await fx?.cleanup();
});

describe("patient-facing e-mail", () => {
  it("the portal invitation is in the patient's language, and its code is blanked from the record once sent", async () => {
    const email = `patient.${fx.tag}@mail-test.example`;
    const inviteId = crypto.randomUUID();
    const input = { patientId: fx.patientId, email, code: "KX7-42Q-9PZ", activateUrl: "http://localhost:3000/pl/activate", inviteId, expiresAt: new Date("2026-12-15T10:00:00Z") };
    const first = await db.transaction((tx) => queuePatientInvitation(tx, input));
    const again = await db.transaction((tx) => queuePatientInvitation(tx, input));
    expect(again).toMatchObject({ id: first.id, created: false });
    await drainOutbox({ keyPrefix: `portal-invite:${inviteId}`, log: quiet });
    const [mail] = await waitForEmails(email, 1);
    expect(mail.subject).toBe("Załóż konto w Caddis");
    expect(mail.html).toContain('lang="pl"');
    expect(mail.text).toContain("KX7-42Q-9PZ");
    expect(mail.text).toContain("Dzień dobry, Halina.");
    const [row] = await db.select().from(outboundMessages).where(eq(outboundMessages.id, first.id));
    expect(row).toMatchObject({ status: "sent", html: "", text: "" });
    const dto = (await listPatientMessages({ patientId: fx.patientId })).find((m) => m.id === first.id)!;
    expect(dto).toMatchObject({ redacted: true, kind: "portal-invite" });
    const res = await call(resend, `/api/patients/${fx.patientId}/messages/${first.id}/resend`, {
      method: "POST",
      cookie: await sessionFor("communityNurse"),
      params: { patientId: fx.patientId, messageId: first.id },
    });
    expect(res.status).toBe(409);
  });

  it("a carer invitation is in the patient's language too (Arabic, right to left)", async () => {
    await db.update(patients).set({ preferredLocale: "ar" }).where(eq(patients.id, fx.patientId));
    const email = `carer.${fx.tag}@mail-test.example`;
    const linkId = crypto.randomUUID();
    await db.transaction((tx) =>
      queueCarerInvitation(tx, { patientId: fx.patientId, email, inviteUrl: `http://localhost:3000/ar/carer-invite/secret-${fx.tag}`, linkId, invitedBy: "Halina Invite-Test" }),
    );
    await drainOutbox({ keyPrefix: `carer-invite:${linkId}`, log: quiet });
    const [mail] = await waitForEmails(email, 1);
    expect(mail.subject).toBe("يدعوك Halina للمساعدة في رعاية القسطرة");
    expect(mail.html).toContain('dir="rtl"');
    expect(mail.html).toContain(`secret-${fx.tag}`);
    const [row] = await db.select().from(outboundMessages).where(eq(outboundMessages.idempotencyKey, `carer-invite:${linkId}`));
    expect(row.text).toBe("");
  });

  it("an invitation that cannot be sent keeps no code either", async () => {
    const r = await db.transaction((tx) =>
      queuePatientInvitation(tx, { patientId: fx.patientId, email: "not an address", code: "SECRET-CODE", activateUrl: "http://localhost:3000/ar/activate", inviteId: crypto.randomUUID() }),
    );
    const [row] = await db.select().from(outboundMessages).where(eq(outboundMessages.id, r.id));
    expect(row).toMatchObject({ status: "failed", lastError: "no_recipient", text: "", html: "" });
  });
});
