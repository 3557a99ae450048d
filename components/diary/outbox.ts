// Diary entries waiting to reach the server (lib/browser/outbox.ts): the patient, a key made on
// the phone (one row however often it is sent), what and how much, and when it was drunk or
// emptied, so an entry made offline keeps its own time.
import { createOutbox } from "@/lib/browser/outbox";

export type PendingDiaryEntry = { patientId: string; clientKey: string; kind: "in" | "out"; volumeMl: number; at: string };

export const diaryOutbox = createOutbox<PendingDiaryEntry>({
  name: "diary",
  storageKey: "caddis.diaryOutbox.v1",
  url: "/api/diary",
  keyOf: (i) => i.clientKey,
  parse: (i) => {
    if (!i || typeof i !== "object") return null;
    const { patientId, clientKey, kind, volumeMl, at } = i as Record<string, unknown>;
    if (typeof patientId !== "string" || typeof clientKey !== "string" || (kind !== "in" && kind !== "out")) return null;
    if (typeof volumeMl !== "number" || typeof at !== "string") return null;
    return { patientId, clientKey, kind, volumeMl, at };
  },
});
