import "server-only";
// Text messages leave through the SMS service's official SDK (@vonage/sms), pointed by
// SMS_API_URL at the hosted service in production and at the local fake (scripts/fake-sms.ts)
// for `npm start` and `npm test`. Only the outbox worker calls it (lib/jobs/outbox-worker.ts).
import { Auth } from "@vonage/auth";
import { SMS, TypeEnum } from "@vonage/sms";
import { env } from "@/lib/config/env";

export type SmsSender = { send(message: { to: string; text: string; clientRef: string }): Promise<string> };

export function createSmsSender(options: { apiUrl?: string; key?: string; secret?: string; from?: string; timeoutMs?: number } = {}): SmsSender {
  const client = new SMS(new Auth({ apiKey: options.key ?? env.SMS_API_KEY, apiSecret: options.secret ?? env.SMS_API_SECRET }), {
    restHost: (options.apiUrl ?? env.SMS_API_URL).replace(/\/+$/, ""),
    timeout: options.timeoutMs ?? 15_000,
  });
  const from = options.from ?? env.SMS_FROM;
  return {
    async send({ to, text, clientRef }) {
      // The service takes the number without "+"; type "unicode" keeps Arabic, Urdu and Polish letters.
      const answer = await client.send({ to: to.replace(/^\+/, ""), from, text, type: TypeEnum.UNICODE, clientRef });
      return answer.messages[0]?.messageId ?? "";
    },
  };
}
