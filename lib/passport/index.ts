import "server-only";
// The passport: issue (or reissue) with a fresh token and short code, the old ones revoked in
// the same transaction; the booklet PDF made at issue time and kept in object storage, because
// the plain token exists only in the issuing response and in that PDF.
import { randomUUID } from "node:crypto";
import { db } from "@/db";
import {
  getBookletRecord,
  replacePassport,
  type BookletRecord,
  type PassportSummary,
} from "@/db/queries/passports";
import { getPatientForInvite } from "@/db/queries/invitations";
import { getReadingComfort } from "@/db/queries/reading";
import { audit } from "@/lib/records/audit";
import { assertRecordOpen, writeRecord } from "@/lib/records/record-state";
import type { Viewer } from "@/lib/auth/session";
import { charriereToMm } from "@/lib/clinical";
import { queueGpSummary } from "@/lib/email/gp-summary";
import { env } from "@/lib/config/env";
import { AppError } from "@/lib/http/errors";
import { isLocale } from "@/lib/i18n/routing";
import { newPatientActivation, recordPatientInvite, type PatientActivation } from "@/lib/portal/invitations";
import { renderPassportPdf, type PassportBookletData } from "@/lib/pdf";
import { qrPngDataUrl, qrSvg } from "@/lib/qr";
import { deleteObject, putObject } from "@/lib/storage";
import {
  formatShortCode,
  generateShortCode,
  generateToken,
  hashShortCode,
  hashToken,
} from "./tokens";
import { isCareTeam } from "@/lib/auth/permissions";
import { TEXT_SIZES } from "@/lib/validations/reading";

export * from "./find";
export * from "./tokens";

/** The address the QR encodes: the public device card (a later issue serves it). */
export function passportUrl(token: string): string {
  return `${new URL(env.APP_URL).origin}/p/${token}`;
}

/** Object key of a passport's booklet: chosen by the server, one per passport. */
export function passportPdfKey({ patientId, passportId }: { patientId: string; passportId: string }): string {
  return `${passportPdfPrefix(patientId)}${passportId}.pdf`;
}

/** Where a patient's booklets are stored (retention deletes everything under it). */
export function passportPdfPrefix(patientId: string): string {
  return `passports/${patientId}/`;
}

/** The patient's language, then English; English alone when that is their language. */
export function passportLanguages(preferredLocale: string): string[] {
  const first = isLocale(preferredLocale) ? preferredLocale : "en";
  return first === "en" ? ["en"] : [first, "en"];
}

/** What the booklet prints, from the record as it is now. */
export function bookletData({
  record,
  url,
  shortCode,
  qrPngDataUrl: qr,
  issuedAt,
  issuedByName,
}: {
  record: BookletRecord;
  url: string;
  shortCode: string;
  qrPngDataUrl: string;
  issuedAt: Date;
  issuedByName: string;
}): PassportBookletData {
  const e = record.currentEpisode;
  const byEpisode = new Map(record.episodes.map((x) => [x.id, x]));
  if (!record.settings.emergencyNumber) {
    throw new AppError("conflict", "Set the emergency number in Administration before issuing a passport.", {
      fields: { emergencyNumber: ["emergency_number_missing"] },
    });
  }
  return {
    locales: passportLanguages(record.patient.preferredLocale),
    region: record.settings.region,
    translationReviews: record.settings.translationReviews,
    url,
    shortCode,
    qrPngDataUrl: qr,
    issuedAt,
    issuedByName,
    patient: {
      givenName: record.patient.givenName,
      familyName: record.patient.familyName,
      dateOfBirth: record.patient.dateOfBirth,
      healthRecordNumber: record.patient.healthRecordNumber,
      allergies: record.patient.allergies,
    },
    device: e
      ? {
          route: e.route,
          catheterType: e.catheterType,
          material: e.material,
          lengthCategory: e.lengthCategory,
          sizeCh: e.sizeCh,
          sizeMm: charriereToMm(e.sizeCh),
          balloonMl: e.balloonMl,
          maker: e.maker,
          productName: e.productName,
          lot: e.lot,
          expiry: e.expiry,
          insertedAt: e.insertedAt,
          insertedByName: e.insertedByName,
          organisationName: e.organisationName,
          indication: e.indication,
          // Stored when the episode was saved, from lib/clinical planDates.
          plannedChangeOn: e.plannedChangeOn,
          reviewDueOn: e.reviewDueOn,
        }
      : null,
    history: record.events.map((ev) => {
      const putIn = ev.kind === "insertion" || ev.kind === "planned_change" || ev.kind === "unplanned_change";
      const episode = putIn ? byEpisode.get(ev.episodeId) : undefined;
      return {
        at: ev.occurredAt,
        kind: ev.kind,
        reason: ev.reason,
        twocOutcome: ev.twocOutcome,
        byName: ev.recordedByName,
        organisationName: ev.organisationName,
        sizeCh: episode?.sizeCh ?? null,
        material: episode?.material ?? null,
        lot: episode?.lot ?? null,
      };
    }),
    checklist: record.checklist
      ? {
          taught: record.checklist.taught,
          suppliesGiven: record.checklist.suppliesGiven,
          suppliesDays: record.checklist.suppliesDays,
          drainage: record.checklist.drainage,
          plannedTwocOn: record.checklist.plannedTwocOn,
          firstVisitOn: record.checklist.firstVisitOn,
          portalActivationGiven: record.checklist.portalActivationGiven,
        }
      : null,
    contacts: {
      emergencyNumber: record.settings.emergencyNumber,
      outOfHoursServiceName: record.settings.outOfHoursServiceName,
      careTeams: record.careTeams,
      gp: record.gp,
    },
  };
}

export type IssuedPassport = {
  passport: PassportSummary;
  /** Shown once: the device card address inside the QR. */
  url: string;
  /** Shown once, grouped: ABCD-EFGH-JKMN. */
  shortCode: string;
  qrSvg: string;
  revokedIds: string[];
  /**
   * Only when asked for: the portal activation code and the booklet that prints it. Neither is
   * stored (the code as an HMAC only); the stored booklet is the same booklet without it.
   */
  activation: { code: string; expiresAt: string; activateUrl: string; pdf: Buffer } | null;
  /** The GP summary queued in the issuing transaction (null if one existed for this passport). */
  gpSummaryQueued: boolean;
};

/**
 * Issues a passport, or reissues it: new token and code, booklet rendered and stored, then the
 * old passport revoked and the new one recorded with its audit event in one transaction. If
 * the transaction fails the stored booklet is deleted again, so nothing is left half-made.
 * The caller has checked that the viewer may act on the patient.
 */
export async function issuePassport({
  viewer,
  patientId,
  via,
  request,
  withActivationCode = false,
}: {
  viewer: Viewer;
  patientId: string;
  via?: "care_team" | "visit_access";
  request?: Request | { headers: Headers } | null;
  /** Print a fresh one-time portal activation code on the booklet (care team only). */
  withActivationCode?: boolean;
}): Promise<IssuedPassport> {
  const record = await getBookletRecord({ patientId });
  if (!record) throw new AppError("not_found");
  // Checked before the booklet is rendered, and again in the issuing transaction.
  await assertRecordOpen(db, patientId);
  let activation: PatientActivation | null = null;
  if (withActivationCode) {
    if (!isCareTeam(via ?? "care_team")) {
      throw new AppError("forbidden", "Only the patient's care team can give a portal activation code.");
    }
    const invitee = await getPatientForInvite({ patientId });
    if (invitee?.userId) {
      throw new AppError("conflict", "This patient already has a portal account.", { fields: { activationCode: ["has_account"] } });
    }
    activation = newPatientActivation(record.patient.preferredLocale);
  }
  const passportId = randomUUID();
  const token = generateToken();
  const code = generateShortCode();
  const url = passportUrl(token);
  const issuedAt = new Date();
  const data = bookletData({
    record,
    url,
    shortCode: formatShortCode(code),
    qrPngDataUrl: await qrPngDataUrl(url),
    issuedAt,
    issuedByName: viewer.name,
  });
  const pdf = await renderPassportPdf(data);
  // Rendered before the transaction (it takes a while); thrown away if the transaction fails.
  const activationPdf = activation
    ? await renderPassportPdf({ ...data, portalActivation: { code: activation.code, expiresAt: activation.expiresAt, activateUrl: activation.activateUrl } })
    : null;
  const key = passportPdfKey({ patientId, passportId });
  await putObject({ key, body: pdf, contentType: "application/pdf" });
  try {
    const result = await writeRecord(patientId, async (tx) => {
      const replaced = await replacePassport(
        {
          id: passportId,
          patientId,
          tokenHash: hashToken(token),
          shortCodeHash: hashShortCode(code),
          languages: data.locales,
          issuedByUserId: viewer.userId,
          issuedAt,
        },
        tx,
      );
      const invite = activation
        ? await recordPatientInvite(tx, { viewer, patientId, activation, request, details: { onPassport: passportId } })
        : null;
      await audit(
        {
          action: "passport.issue",
          actor: viewer,
          patientId,
          via: via ?? "care_team",
          request,
          details: {
            passportId,
            revoked: replaced.revokedIds,
            languages: data.locales,
            pdfBytes: pdf.byteLength,
            ...(invite ? { activationInviteId: invite.id } : {}),
          },
        },
        tx,
      );
      // The GP practice hears of the issue from the outbox, in this same transaction.
      const summary = await queueGpSummary(tx, { patientId, passportId, cause: "passport", actorName: viewer.name });
      return { ...replaced, gpSummaryQueued: summary.created };
    });
    return {
      passport: {
        id: result.passport.id,
        issuedAt: result.passport.issuedAt.toISOString(),
        issuedByName: viewer.name,
        languages: result.passport.languages,
        revokedAt: null,
      },
      url,
      shortCode: formatShortCode(code),
      qrSvg: await qrSvg(url),
      revokedIds: result.revokedIds,
      activation:
        activation && activationPdf
          ? { code: activation.code, expiresAt: activation.expiresAt.toISOString(), activateUrl: activation.activateUrl, pdf: activationPdf }
          : null,
      gpSummaryQueued: result.gpSummaryQueued,
    };
  } catch (error) {
    await deleteObject({ key }).catch(() => {});
    throw error;
  }
}

/**
 * The booklet a patient or carer downloads from the portal, made now from the record: the same
 * pages without the QR and passport code (the token is kept only as a hash, and the code is for
 * clinicians), the patient pages in the reader's own text size and contrast. The caller has
 * checked that the viewer is the patient or one of their carers.
 */
export async function readerBooklet({ viewer, patientId }: { viewer: Viewer; patientId: string }): Promise<Buffer> {
  const [record, comfort] = await Promise.all([getBookletRecord({ patientId }), getReadingComfort({ userId: viewer.userId })]);
  if (!record) throw new AppError("not_found");
  const data = bookletData({ record, url: "", shortCode: "", qrPngDataUrl: "", issuedAt: new Date(), issuedByName: viewer.name });
  return renderPassportPdf({ ...data, readerCopy: { textScale: TEXT_SIZES[comfort.textSize] / 100, highContrast: comfort.contrast === "high" } });
}
