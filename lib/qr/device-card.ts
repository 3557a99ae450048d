import "server-only";
// Opening a passport's device card by QR token or typed short code: lookup (hash, then a
// constant-time compare, in lib/passport), the card, and an audit event for every view.
// Unknown and revoked passports give one and the same answer. The per-address limit is applied
// before this, in proxy.ts (lib/qr/card-limit.ts), so a limited request costs one statement.
import { getDeviceCard, type DeviceCard } from "@/db/queries/passport-card";
import { audit } from "@/lib/records/audit";
import type { Viewer } from "@/lib/auth/session";
import { findPassportByShortCode, findPassportByToken, type FoundPassport } from "@/lib/passport";

export type CardResult = { kind: "ok"; card: DeviceCard; passport: FoundPassport } | { kind: "invalid" };

/** A QR token (43 characters) or a short code (12 symbols, dashes and spaces allowed). */
export async function findPassport(credential: string): Promise<FoundPassport | null> {
  if (typeof credential !== "string") return null;
  return credential.length === 43 ? findPassportByToken(credential) : findPassportByShortCode(credential);
}

export async function openDeviceCard({
  credential,
  request,
  viewer,
}: {
  credential: string;
  request: { headers: Headers };
  viewer: Viewer | null;
}): Promise<CardResult> {
  const passport = await findPassport(credential);
  const card = passport ? await getDeviceCard({ patientId: passport.patientId }) : null;
  if (!passport || !card) {
    await audit({ action: "passport.card.invalid", actor: viewer, via: "qr", request });
    return { kind: "invalid" };
  }
  await audit({
    action: "passport.card.view",
    actor: viewer,
    patientId: passport.patientId,
    via: "qr",
    request,
    details: { passportId: passport.passportId, by: credential.length === 43 ? "token" : "short-code" },
  });
  return { kind: "ok", card, passport };
}
