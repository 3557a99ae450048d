// NEWS2 at home: whom a community nurse calls at each RCP response level. RCP NEWS2 (2017)
// chart 4 is written for hospital wards ("inform the medical team", "hourly monitoring"), and no
// published community version of it was found, so the contacts below are common practice, no
// source (hazard log H-QR-008, for the clinical safety officer). The RCP response stays the
// source of truth and is shown beside them.
import type { News2ResponseKey } from "./news2";
import type { SourceId } from "./sources";

/** Whom to call, in order: the patient's GP, the care team, the out-of-hours service, the emergency number. */
export const NEWS2_HOME_CONTACTS = ["gp", "team", "out-of-hours", "emergency"] as const;
export type News2HomeContact = (typeof NEWS2_HOME_CONTACTS)[number];

export interface News2HomeResponse {
  key: News2ResponseKey;
  /** Whom to call at this level, first choice first (empty: carry on with the planned visits). */
  call: readonly News2HomeContact[];
  source: SourceId;
}

const CP: SourceId = "common-practice";

export const NEWS2_HOME_RESPONSES: Record<News2ResponseKey, News2HomeResponse> = {
  routine: { key: "routine", call: [], source: CP },
  "ward-assessment": { key: "ward-assessment", call: ["team", "gp"], source: CP },
  "urgent-ward-review": { key: "urgent-ward-review", call: ["gp", "out-of-hours"], source: CP },
  urgent: { key: "urgent", call: ["gp", "out-of-hours", "emergency"], source: CP },
  emergency: { key: "emergency", call: ["emergency"], source: CP },
};

export function news2HomeResponse(key: News2ResponseKey): News2HomeResponse {
  return NEWS2_HOME_RESPONSES[key];
}
