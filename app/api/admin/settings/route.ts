import { db } from "@/db";
import { audit } from "@/lib/records/audit";
import { requireRole } from "@/lib/auth/permissions";
import { handle, json } from "@/lib/http/handle";
import { getSettings, updateSettings } from "@/lib/config/settings";
import { parseJsonBody } from "@/lib/http/validate";
import { settingsPatchSchema } from "@/lib/validations/settings";

/** The deployment settings (one set for the whole deployment). */
export const GET = handle(async (request) => {
  await requireRole(request, "admin");
  return json({ settings: await getSettings() });
});

/** Sets or clears settings; each change is an audit event with the old and new values. */
export const PATCH = handle(async (request) => {
  const viewer = await requireRole(request, "admin");
  const patch = await parseJsonBody(request, settingsPatchSchema);
  const settings = await db.transaction(async (tx) => {
    const before = await getSettings(tx);
    const keys = await updateSettings(tx, patch);
    const after = await getSettings(tx);
    const changes = Object.fromEntries(
      keys
        .filter((k) => JSON.stringify(before[k]) !== JSON.stringify(after[k]))
        .map((k) => [k, { from: before[k], to: after[k] }]),
    );
    if (Object.keys(changes).length) {
      await audit({ action: "admin.settings.update", actor: viewer, via: "admin", request, details: { changes } }, tx);
    }
    return after;
  });
  return json({ settings });
});
