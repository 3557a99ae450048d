import "server-only";
// Opening a passport's device card: rate limit per hashed client address, token lookup, audit.
// Unknown and revoked tokens give one and the same answer.
import { findCurrentPassportByToken, getDeviceCard, type DeviceCard } from "@/db/queries/passport-card";
import { audit } from "@/lib/audit";
import type { Viewer } from "@/lib/auth/session";
import { checkAddress, LIMITS } from "@/lib/rate-limit";

export const CARD_LIMIT = LIMITS.passportCard;

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
  const { allowed } = await checkAddress(request, CARD_LIMIT);
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
