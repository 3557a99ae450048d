import { deletePushSubscription, savePushSubscription } from "@/db/queries/push-subscriptions";
import { requirePortalViewer } from "@/lib/auth/permissions";
import { getVapidKeys } from "@/lib/config/push";
import { handle, json } from "@/lib/http/handle";
import { parseJsonBody } from "@/lib/http/validate";
import { pushSubscribeSchema, pushUnsubscribeSchema } from "@/lib/validations/reach";

/** The key the browser subscribes with (null: push is not set up on this server). */
export const GET = handle(async (request) => {
  await requirePortalViewer(request);
  return json({ publicKey: getVapidKeys()?.publicKey ?? null });
});

/** This browser's subscription, for the viewer (patient or carer) themselves. */
export const POST = handle(async (request) => {
  const viewer = await requirePortalViewer(request);
  const input = await parseJsonBody(request, pushSubscribeSchema);
  const row = await savePushSubscription({ userId: viewer.userId, endpoint: input.endpoint, p256dh: input.keys.p256dh, auth: input.keys.auth });
  return json({ subscribed: true, id: row.id }, { status: 201 });
});

/** Stops pushes to this browser; another person's subscription is never touched. */
export const DELETE = handle(async (request) => {
  const viewer = await requirePortalViewer(request);
  const input = await parseJsonBody(request, pushUnsubscribeSchema);
  const removed = await deletePushSubscription({ userId: viewer.userId, endpoint: input.endpoint });
  return json({ removed });
});
