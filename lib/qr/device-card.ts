import "server-only";
// Opening a passport's device card: rate limit per hashed client address, token lookup, audit.
// Unknown and revoked tokens give one and the same answer.
import { findCurrentPassportByToken, getDeviceCard, type DeviceCard } from "@/db/queries/passport-card";
import { audit } from "@/lib/audit";
import type { Viewer } from "@/lib/auth/session";
import { clientIp, hashIp } from "@/lib/client-ip";
import { hitRateLimit } from "@/lib/rate-limit";

export const CARD_LIMIT = { limit: 30, windowSeconds: 60 } as const;

export type CardResult = { kind: "ok"; card: DeviceCard } | { kind: "invalid" } | { kind: "limited" };

export async function openDeviceCard({
  token,
  request,
  viewer,
}: {
  token: string;
  request: { headers: Headers };
  viewer: Viewer | null;
}): Promise<CardResult> {
  const key = `card:${hashIp(clientIp(request.headers))}`;
  const { allowed } = await hitRateLimit({ key, ...CARD_LIMIT });
  if (!allowed) return { kind: "limited" };
  const passport = await findCurrentPassportByToken({ token });
  if (!passport) {
    await audit({ action: "passport.card.invalid", actor: viewer, via: "qr", request });
    return { kind: "invalid" };
  }
  const card = await getDeviceCard({ patientId: passport.patientId });
  await audit({ action: "passport.card.view", actor: viewer, patientId: passport.patientId, via: "qr", request, details: { passportId: passport.id } });
  return { kind: "ok", card };
}
