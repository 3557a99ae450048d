import "server-only";
import { and, desc, eq } from "drizzle-orm";
import { db, type Executor } from "@/db";
import { bagChanges } from "@/db/schema";
import { BAG_KINDS, type BagKind } from "@/lib/clinical";

export async function addBagChange(
  values: { patientId: string; kind: BagKind; changedOn: string; recordedByUserId: string },
  tx: Executor = db,
) {
  const [row] = await tx.insert(bagChanges).values(values).returning();
  return row;
}

/** The latest change of each kind the patient has logged. */
export async function getLastBagChanges({ patientId }: { patientId: string }, tx: Executor = db) {
  const out: { kind: BagKind; lastChangedOn: string }[] = [];
  for (const kind of BAG_KINDS) {
    const [row] = await tx
      .select({ changedOn: bagChanges.changedOn })
      .from(bagChanges)
      .where(and(eq(bagChanges.patientId, patientId), eq(bagChanges.kind, kind)))
      .orderBy(desc(bagChanges.changedOn), desc(bagChanges.createdAt))
      .limit(1);
    if (row) out.push({ kind, lastChangedOn: row.changedOn });
  }
  return out;
}
