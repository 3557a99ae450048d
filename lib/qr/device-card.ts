import "server-only";
// Opening a passport's device card by QR token or typed short code: lookup (hash, then a
// constant-time compare, in lib/passport), the card, and an audit event for every view.
// Unknown and revoked passports give one and the same answer. The per-address limit is applied
// before this, in proxy.ts (lib/qr/card-limit.ts), so a limited request costs one statement.
import { getDeviceCard, type DeviceCard } from "@/db/queries/passport-card";
import { audit } from "@/lib/records/audit";
import type { Viewer } from "@/lib/auth/session";
import { findPassportByShortCode, findPassportByToken, type FoundPassport } from "@/lib/passport";
import { readShortCode } from "@/lib/passport/tokens";

/**
 * "typo": a typed code that cannot be any code (its check symbol is wrong, or it has the wrong
 * length or letters): the person is asked to check it. Unknown and revoked codes are both
 * "invalid", so a stranger learns nothing from the difference.
 */
export type CardResult = { kind: "ok"; card: DeviceCard; passport: FoundPassport } | { kind: "invalid" } | { kind: "typo" };

const isToken = (credential: string) => credential.length === 43;

/** A QR token (43 characters) or a short code (13 symbols with its check symbol, or 12 from before; dashes and spaces allowed). */
export async function findPassport(credential: string): Promise<FoundPassport | null> {
  if (typeof credential !== "string") return null;
  return isToken(credential) ? findPassportByToken(credential) : findPassportByShortCode(credential);
}

/** True when a typed short code is mistyped (told apart from one that is unknown or revoked). */
export function isMistypedCode(credential: string): boolean {
  return typeof credential === "string" && !isToken(credential) && readShortCode(credential).kind !== "code";
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
  const via = isToken(credential) ? "qr" : "short_code";
  if (isMistypedCode(credential)) {
    await audit({ action: "passport.card.typo", actor: viewer, via, request });
    return { kind: "typo" };
  }
  const passport = await findPassport(credential);
  const card = passport ? await getDeviceCard({ patientId: passport.patientId }) : null;
  if (!passport || !card) {
    await audit({ action: "passport.card.invalid", actor: viewer, via, request });
    return { kind: "invalid" };
  }
  // A view by the typed code is logged as such, not as a QR scan.
  await audit({
    action: "passport.card.view",
    actor: viewer,
    patientId: passport.patientId,
    via,
    request,
    details: { passportId: passport.passportId, by: isToken(credential) ? "token" : "short-code" },
  });
  return { kind: "ok", card, passport };
}
