import "server-only";
// Web Push (RFC 8030 delivery, RFC 8291 aes128gcm payload encryption, RFC 8292 VAPID) with the
// web-push package. Only the outbox worker calls it (lib/jobs/outbox-worker.ts).
import type https from "node:https";
import webpush, { WebPushError } from "web-push";
import { getVapidKeys } from "@/lib/config/push";

export type PushTarget = { endpoint: string; p256dh: string; auth: string };
export type PushPayload = { title: string; body: string; url: string | null; tag: string };

/** The push service no longer knows this subscription (404/410): the caller removes it. */
export class SubscriptionGone extends Error {}

export type PushSender = { send(target: PushTarget, payload: PushPayload): Promise<void> };

export function createPushSender(options: { agent?: https.Agent; timeoutMs?: number } = {}): PushSender {
  return {
    async send(target, payload) {
      const keys = getVapidKeys();
      if (!keys) throw new Error("push_unavailable: no VAPID keys");
      try {
        await webpush.sendNotification(
          { endpoint: target.endpoint, keys: { p256dh: target.p256dh, auth: target.auth } },
          JSON.stringify(payload),
          {
            vapidDetails: { subject: keys.subject, publicKey: keys.publicKey, privateKey: keys.privateKey },
            contentEncoding: "aes128gcm",
            // A reminder older than half a day is no use; the push service may drop it then.
            TTL: 12 * 3600,
            timeout: options.timeoutMs ?? 15_000,
            ...(options.agent ? { agent: options.agent } : {}),
          },
        );
      } catch (error) {
        if (error instanceof WebPushError && (error.statusCode === 404 || error.statusCode === 410)) {
          throw new SubscriptionGone(`subscription_gone ${error.statusCode}`);
        }
        if (error instanceof WebPushError) throw new Error(`push ${error.statusCode} ${error.body ?? ""}`.trim());
        throw error;
      }
    },
  };
}
