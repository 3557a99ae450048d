import "server-only";
// Transfer of care: a clinician of the care team refers the patient to another ward or
// community team; the receiving team accepts (it joins the care team and leads it; the referrer's
// team stays or leaves as the referrer chose) or declines with a reason that goes back. The care
// team can also add a team, change the lead, or leave while another team remains. Every step
// runs in writeRecord (a closed record answers 409) with its audit event.
import {
  addToCareTeam,
  answerReferral,
  getReferralForUpdate,
  getTeamOrganisation,
  insertDischargeChecklist,
  insertReferral,
  listCareTeam,
  otherTeamsRemain,
  removeFromCareTeam,
  setLead,
} from "@/db/queries/referrals";
import type { Transaction } from "@/db";
import { getActiveEpisode, setTwocPlan } from "@/db/queries/episodes";
import type { Viewer } from "@/lib/auth/session";
import { queueReferralMail } from "@/lib/email/referral-mail";
import { AppError, pgConstraint } from "@/lib/http/errors";
import type { DischargeChecklistValues } from "@/lib/validations/referrals";
import { audit } from "./audit";
import { writeRecord } from "./record-state";

type Ctx = { viewer: Viewer; request: Request };

/** The viewer's own team on this care team that acts: the one named, else their only one. */
async function actingTeam(tx: Transaction, viewer: Viewer, patientId: string, named?: string) {
  const team = await listCareTeam({ patientId }, tx);
  const own = team.filter((m) => viewer.organisationIds.includes(m.organisationId));
  if (named) {
    const found = own.find((m) => m.organisationId === named);
    if (!found) throw new AppError("validation_failed", undefined, { fields: { fromOrganisationId: ["not_your_team"] } });
    return found;
  }
  if (own.length !== 1) throw new AppError("validation_failed", undefined, { fields: { fromOrganisationId: ["choose_one"] } });
  return own[0];
}

export async function recordDischargeChecklist(
  { patientId, values, referralId = null, organisationId = null }: { patientId: string; values: DischargeChecklistValues; referralId?: string | null; organisationId?: string | null },
  { viewer, request }: Ctx,
  tx: Transaction,
) {
  const row = await insertDischargeChecklist({ patientId, referralId, userId: viewer.userId, userName: viewer.name, organisationId, values }, tx);
  // The checklist's planned trial becomes the plan of the catheter in place (its medicine note kept).
  if (values.plannedTwocOn) {
    const active = await getActiveEpisode({ patientId }, tx);
    if (active) await setTwocPlan({ episodeId: active.id, plannedOn: values.plannedTwocOn, medicineNote: active.twocMedicineNote }, tx);
  }
  const notDone = { taughtMissing: values.taught.length, suppliesGiven: values.suppliesGiven, portalActivationGiven: values.portalActivationGiven };
  await audit({ action: "discharge-checklist.record", actor: viewer, patientId, via: "care_team", request, details: { checklistId: row.id, referralId, ...notDone } }, tx);
  return row;
}

export function saveDischargeChecklist({ patientId, values }: { patientId: string; values: DischargeChecklistValues }, ctx: Ctx) {
  return writeRecord(patientId, async (tx) => {
    const team = await listCareTeam({ patientId }, tx);
    const own = team.find((m) => ctx.viewer.organisationIds.includes(m.organisationId));
    return recordDischargeChecklist({ patientId, values, organisationId: own?.organisationId ?? null }, ctx, tx);
  });
}

export function createReferral(
  {
    patientId,
    input,
  }: {
    patientId: string;
    input: { toOrganisationId: string; fromOrganisationId?: string; handoverNote: string; referrerStays: boolean; checklist?: DischargeChecklistValues };
  },
  ctx: Ctx,
) {
  return writeRecord(patientId, async (tx) => {
    const from = await actingTeam(tx, ctx.viewer, patientId, input.fromOrganisationId);
    const to = await getTeamOrganisation({ id: input.toOrganisationId }, tx);
    if (!to) throw new AppError("validation_failed", undefined, { fields: { toOrganisationId: ["choose_one"] } });
    const team = await listCareTeam({ patientId }, tx);
    if (team.some((m) => m.organisationId === to.id)) {
      throw new AppError("validation_failed", undefined, { fields: { toOrganisationId: ["already_on_team"] } });
    }
    let referral;
    try {
      referral = await insertReferral(
        { patientId, fromOrganisationId: from.organisationId, toOrganisationId: to.id, referredByUserId: ctx.viewer.userId, handoverNote: input.handoverNote, referrerStays: input.referrerStays },
        tx,
      );
    } catch (error) {
      if (pgConstraint(error) === "referrals_one_pending_uq") {
        throw new AppError("conflict", "This team already has a referral for this patient waiting.", { fields: { toOrganisationId: ["already_referred"] } });
      }
      throw error;
    }
    if (input.checklist) await recordDischargeChecklist({ patientId, values: input.checklist, referralId: referral.id, organisationId: from.organisationId }, ctx, tx);
    await audit(
      {
        action: "referral.create",
        actor: ctx.viewer,
        patientId,
        organisationId: from.organisationId,
        via: "care_team",
        request: ctx.request,
        details: { referralId: referral.id, from: from.name, to: to.name, toOrganisationId: to.id, referrerStays: input.referrerStays, withChecklist: Boolean(input.checklist) },
      },
      tx,
    );
    await queueReferralMail(tx, { referralId: referral.id, event: "new" });
    return { id: referral.id, status: referral.status };
  });
}

/** The referral for its receiving team's answer: a clinician of that team, else 404. */
async function openForAnswer(tx: Transaction, viewer: Viewer, referralId: string) {
  const referral = await getReferralForUpdate({ id: referralId }, tx);
  if (!referral || !viewer.organisationIds.includes(referral.toOrganisationId)) throw new AppError("not_found");
  if (referral.status !== "pending") throw new AppError("conflict", "This referral has already been answered.", { fields: { referral: [`already_${referral.status}`] } });
  return referral;
}

export async function acceptReferral({ referralId, patientId }: { referralId: string; patientId: string }, ctx: Ctx) {
  return writeRecord(patientId, async (tx) => {
    const referral = await openForAnswer(tx, ctx.viewer, referralId);
    await answerReferral({ id: referral.id, status: "accepted", userId: ctx.viewer.userId }, tx);
    await addToCareTeam({ patientId, organisationId: referral.toOrganisationId }, tx);
    await setLead({ patientId, organisationId: referral.toOrganisationId }, tx);
    // The referrer chose to leave: their team comes off the care team now that another leads.
    const left = !referral.referrerStays && (await removeFromCareTeam({ patientId, organisationId: referral.fromOrganisationId }, tx));
    await audit(
      {
        action: "referral.accept",
        actor: ctx.viewer,
        patientId,
        organisationId: referral.toOrganisationId,
        via: "care_team",
        request: ctx.request,
        details: { referralId, leadOrganisationId: referral.toOrganisationId, referrerLeft: left },
      },
      tx,
    );
    return { id: referralId, status: "accepted" as const };
  });
}

export async function declineReferral({ referralId, patientId, reason }: { referralId: string; patientId: string; reason: string }, ctx: Ctx) {
  return writeRecord(patientId, async (tx) => {
    const referral = await openForAnswer(tx, ctx.viewer, referralId);
    await answerReferral({ id: referral.id, status: "declined", userId: ctx.viewer.userId, declineReason: reason }, tx);
    await audit(
      { action: "referral.decline", actor: ctx.viewer, patientId, organisationId: referral.toOrganisationId, via: "care_team", reason, request: ctx.request, details: { referralId } },
      tx,
    );
    await queueReferralMail(tx, { referralId, event: "declined" });
    return { id: referralId, status: "declined" as const };
  });
}

/** The care team takes back a referral still waiting (e.g. sent to the wrong team). */
export async function withdrawReferral({ referralId, patientId }: { referralId: string; patientId: string }, ctx: Ctx) {
  return writeRecord(patientId, async (tx) => {
    const referral = await getReferralForUpdate({ id: referralId }, tx);
    if (!referral || referral.patientId !== patientId) throw new AppError("not_found");
    if (referral.status !== "pending") throw new AppError("conflict", "This referral has already been answered.", { fields: { referral: [`already_${referral.status}`] } });
    await answerReferral({ id: referral.id, status: "withdrawn", userId: ctx.viewer.userId }, tx);
    await audit({ action: "referral.withdraw", actor: ctx.viewer, patientId, via: "care_team", request: ctx.request, details: { referralId } }, tx);
    return { id: referralId, status: "withdrawn" as const };
  });
}

export async function addCareTeamOrganisation({ patientId, organisationId, reason }: { patientId: string; organisationId: string; reason: string }, ctx: Ctx) {
  return writeRecord(patientId, async (tx) => {
    const org = await getTeamOrganisation({ id: organisationId }, tx);
    if (!org) throw new AppError("validation_failed", undefined, { fields: { organisationId: ["choose_one"] } });
    if (!(await addToCareTeam({ patientId, organisationId }, tx))) throw new AppError("validation_failed", undefined, { fields: { organisationId: ["already_on_team"] } });
    await audit({ action: "care-team.add", actor: ctx.viewer, patientId, organisationId, via: "care_team", reason, request: ctx.request, details: { name: org.name } }, tx);
    return { organisationId };
  });
}

export async function changeLead({ patientId, organisationId, reason }: { patientId: string; organisationId: string; reason: string }, ctx: Ctx) {
  return writeRecord(patientId, async (tx) => {
    const team = await listCareTeam({ patientId }, tx);
    const next = team.find((m) => m.organisationId === organisationId);
    if (!next) throw new AppError("validation_failed", undefined, { fields: { leadOrganisationId: ["not_on_team"] } });
    const previous = team.find((m) => m.lead) ?? null;
    await setLead({ patientId, organisationId }, tx);
    await audit(
      { action: "care-team.lead", actor: ctx.viewer, patientId, organisationId, via: "care_team", reason, request: ctx.request, details: { from: previous?.name ?? null, to: next.name } },
      tx,
    );
    return { leadOrganisationId: organisationId };
  });
}

/** A clinician takes their own team off the care team, while another ward or community team remains. */
export async function leaveCareTeam({ patientId, organisationId, reason }: { patientId: string; organisationId: string; reason: string }, ctx: Ctx) {
  return writeRecord(patientId, async (tx) => {
    const team = await listCareTeam({ patientId }, tx);
    const own = team.find((m) => m.organisationId === organisationId);
    if (!own) throw new AppError("not_found");
    if (!(await otherTeamsRemain({ patientId, organisationId }, tx))) {
      throw new AppError("conflict", "Another team must be on the care team before yours leaves.", { fields: { organisationId: ["last_team"] } });
    }
    await removeFromCareTeam({ patientId, organisationId }, tx);
    await audit({ action: "care-team.leave", actor: ctx.viewer, patientId, organisationId, via: "care_team", reason, request: ctx.request, details: { name: own.name, wasLead: own.lead } }, tx);
    return { organisationId };
  });
}
