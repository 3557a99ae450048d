import "server-only";
// Opening a passport's device card by QR token or typed short code: lookup (hash, then a
// constant-time compare, in lib/passport), the card, and an audit event for every view.
// Unknown and revoked passports give one and the same answer. The per-address limit is applied
// before this, in proxy.ts (lib/qr/card-limit.ts), so a limited request costs one statement.
import { getDeviceCard, openCardByTokenHash, type CardByToken, type DeviceCard } from "@/db/queries/passport-card";
import { getRegion } from "@/lib/config/settings";
import { clientIp, hashIp } from "@/lib/http/client-ip";
import { checkAddress, limitKey } from "@/lib/http/rate-limit";
import { CARD_LIMIT } from "@/lib/qr/card-limit";
import { audit } from "@/lib/records/audit";
import type { Viewer } from "@/lib/auth/session";
import { findPassportByShortCode, findPassportByToken, type FoundPassport } from "@/lib/passport/find";
import { hashToken, isWellFormedToken, readShortCode } from "@/lib/passport/tokens";

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

/**
 * The card at its QR address: a well-formed token in one round trip (limit, lookup, card and
 * audit together: db/queries/passport-card.ts openCardByTokenHash); anything else typed into the
 * address (a short code, a mistake) the longer way, with the same limit first.
 */
export async function openCardAtAddress({
  credential,
  request,
  viewer,
}: {
  credential: string;
  request: { headers: Headers };
  viewer: Viewer | null;
}): Promise<CardByToken | { kind: "typo" }> {
  if (isToken(credential) && isWellFormedToken(credential)) {
    return openCardByTokenHash({
      tokenHash: hashToken(credential),
      limit: { key: limitKey(request, CARD_LIMIT), max: CARD_LIMIT.max, windowSeconds: CARD_LIMIT.windowSeconds },
      actor: viewer ? { userId: viewer.userId, role: viewer.role } : null,
      ipHash: hashIp(clientIp(request.headers)),
    });
  }
  const limit = await checkAddress(request, CARD_LIMIT);
  if (!limit.allowed) return { kind: "limited", retryAfterSeconds: limit.retryAfterSeconds };
  const result = await openDeviceCard({ credential, request, viewer });
  if (result.kind !== "ok") return result;
  return { kind: "ok", card: result.card, region: await getRegion(), patientId: result.passport.patientId, passportId: result.passport.passportId };
}
