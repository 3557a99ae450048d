import { getMessageById } from "@/db/queries/outbox";
import { getSupplyContext, insertSupplyRequest, listSupplyRequests, setSupplyRequestMessage } from "@/db/queries/supply-requests";
import { requireStaffPatientAccess, requireUser } from "@/lib/auth/permissions";
import { audit } from "@/lib/records/audit";
import { suppliesFor } from "@/lib/clinical";
import { queueSupplyRequestEmail } from "@/lib/email/supply-request";
import { AppError } from "@/lib/http/errors";
import { handle, json } from "@/lib/http/handle";
import { openPatientRecord } from "@/lib/records/patient-record";
import { writeRecord } from "@/lib/records/record-state";
import { parseJsonBody } from "@/lib/http/validate";
import { supplyRequestSchema } from "@/lib/validations/supply-request";

type Ctx = { params: Promise<{ patientId: string }> };

export const GET = handle<Ctx>(async (request, { params }) => {
  const { patientId } = await params;
  const viewer = await requireUser(request);
  await openPatientRecord({ viewer, patientId, action: "patient.view.supplies", request, details: { source: "api" } });
  return json({ supplyRequests: await listSupplyRequests({ patientId }) });
});

/**
 * The nurse's reviewed request: the quantities lib/clinical suggests for the period are worked out
 * again here and kept beside the ones asked for; the e-mail to the GP goes through the outbox in
 * the same transaction.
 */
export const POST = handle<Ctx>(async (request, { params }) => {
  const { patientId } = await params;
  const viewer = await requireUser(request);
  const via = await requireStaffPatientAccess(viewer, patientId);
  const input = await parseJsonBody(request, supplyRequestSchema);
  return writeRecord(patientId, async (tx) => {
    const ctx = await getSupplyContext({ patientId }, tx);
    if (!ctx) throw new AppError("not_found");
    if (!ctx.episode || !ctx.changeIntervalDays) throw new AppError("conflict", "There is no catheter in place to request supplies for.");
    const plan = { changeIntervalDays: ctx.changeIntervalDays, firstChangeInDays: ctx.firstChangeInDays ?? undefined, spareCatheters: ctx.spareCatheters, ...input.include };
    const computed = suppliesFor(plan, input.periodDays);
    const asked = new Map(input.items.map((i) => [i.item, i.quantity]));
    if (computed.lines.length !== asked.size || computed.lines.some((l) => !asked.has(l.item))) {
      throw new AppError("validation_failed", undefined, { fields: { items: ["itemsChanged"] } });
    }
    const request_ = await insertSupplyRequest(
      {
        values: {
          patientId,
          episodeId: ctx.episode.id,
          gpPracticeId: ctx.gp?.id ?? null,
          periodDays: input.periodDays,
          items: computed.lines.map((l) => ({ item: l.item, computed: l.quantity, quantity: asked.get(l.item)!, intervalDays: l.intervalDays })),
          note: input.note || null,
          requestedByUserId: viewer.userId,
          requestedByName: viewer.name,
        },
      },
      tx,
    );
    const queued = await queueSupplyRequestEmail(tx, {
      request: request_,
      patient: ctx.patient,
      episode: ctx.episode,
      gp: ctx.gp,
      actorName: viewer.name,
      createdByUserId: viewer.userId,
    });
    await setSupplyRequestMessage({ id: request_.id, messageId: queued.id }, tx);
    await audit(
      { action: "supply-request.create", actor: viewer, patientId, via, request, details: { supplyRequestId: request_.id, messageId: queued.id, periodDays: input.periodDays } },
      tx,
    );
    const message = await getMessageById({ id: queued.id }, tx);
    return json(
      {
        supplyRequest: {
          id: request_.id,
          periodDays: request_.periodDays,
          items: request_.items,
          note: request_.note,
          requestedByName: request_.requestedByName,
          createdAt: request_.createdAt.toISOString(),
          message: message ? { id: message.id, status: message.status, to: message.toAddress, sentAt: null, lastError: message.lastError } : null,
        },
      },
      { status: 201 },
    );
  });
});
