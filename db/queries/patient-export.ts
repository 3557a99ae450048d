import "server-only";
import { eq, getTableColumns, getTableName, is } from "drizzle-orm";
import { PgTable, type PgColumn } from "drizzle-orm/pg-core";
import { db, type Executor } from "@/db";
import * as schema from "@/db/schema";
import { translatorFor } from "@/lib/i18n/catalogues";
import { allAccessLines } from "@/lib/portal/access-words";

// Columns never exported: hashes of tokens and passwords, secrets, session tokens.
const SECRET_COLUMN = /(password|token|secret|hash|backup_codes)/i;

type AnyTable = PgTable;

/** Every table of the schema with a patient_id column: a new table is covered without a change here. */
export function tablesWithPatientId(): { name: string; table: AnyTable; column: PgColumn }[] {
  const out: { name: string; table: AnyTable; column: PgColumn }[] = [];
  for (const value of Object.values(schema)) {
    if (!is(value, PgTable)) continue;
    const column = Object.values(getTableColumns(value)).find((c) => c.name === "patient_id");
    if (column) out.push({ name: getTableName(value), table: value as unknown as AnyTable, column });
  }
  return out.sort((a, b) => a.name.localeCompare(b.name));
}

/** better-auth's tables keyed by the patient's own user id. */
const userTables = [schema.session, schema.account, schema.twoFactor] as const;

function withoutSecrets(table: PgTable, rows: Record<string, unknown>[]) {
  const columns = getTableColumns(table);
  const hidden = Object.entries(columns)
    .filter(([, c]) => SECRET_COLUMN.test(c.name))
    .map(([key]) => key);
  return rows.map((r) => Object.fromEntries(Object.entries(r).filter(([k]) => !hidden.includes(k))));
}

/** An e-mail that holds a one-time code or link (not yet sent, so not yet blanked) leaves it out. */
function withoutOneTimeBodies(row: Record<string, unknown>) {
  return row.redactAfterSend === true ? { ...row, html: "", text: "" } : row;
}

export type PatientExport = {
  format: "caddis-patient-export/1";
  exportedAt: string;
  patientId: string;
  /** Table name → that table's rows for this patient, secrets left out. */
  tables: Record<string, Record<string, unknown>[]>;
  /** Who looked at the record, as the portal's "who looked" page says it: names, not ids. */
  accessLog: ExportAccessLine[];
  omittedColumns: string[];
};

export type ExportAccessLine = {
  at: string;
  firstAt: string;
  times: number;
  who: string;
  role: string | null;
  organisation: string | null;
  how: string;
  reason: string | null;
  what: string;
};

/** The access log in the patient's language, the same words as the portal page. */
async function accessLogInWords(patientId: string, locale: string, tx: Executor): Promise<ExportAccessLine[]> {
  const reach = translatorFor(locale, "PortalReach.access");
  const log = translatorFor(locale, "PatientAccessLog");
  const vocab = translatorFor(locale, "Vocabulary");
  return (await allAccessLines({ patientId }, tx)).map((l) => ({
    at: l.at,
    firstAt: l.firstAt,
    times: l.count,
    who: l.name ?? (l.role ? reach("removedAccount") : reach("notSignedIn")),
    role: l.role ? vocab(`role.${l.role}`) : null,
    organisation: l.organisation,
    how: reach(`how.${l.how}`),
    reason: l.reason,
    what: log.has(`actions.${l.actionKey}` as "actions.patient_create") ? log(`actions.${l.actionKey}` as "actions.patient_create") : l.action,
  }));
}

export async function exportPatientData({ patientId }: { patientId: string }, tx: Executor = db): Promise<PatientExport | null> {
  const [patient] = await tx.select().from(schema.patients).where(eq(schema.patients.id, patientId));
  if (!patient) return null;
  const tables: PatientExport["tables"] = { patients: withoutSecrets(schema.patients, [patient]) };
  for (const { name, table, column } of tablesWithPatientId()) {
    const rows = (await tx.select().from(table).where(eq(column, patientId))) as Record<string, unknown>[];
    tables[name] = withoutSecrets(table, rows).map(withoutOneTimeBodies);
  }
  if (patient.userId) {
    const users = await tx.select().from(schema.user).where(eq(schema.user.id, patient.userId));
    tables.user = withoutSecrets(schema.user, users);
    for (const t of userTables) {
      const rows = (await tx.select().from(t).where(eq(t.userId, patient.userId))) as Record<string, unknown>[];
      tables[getTableName(t)] = withoutSecrets(t, rows);
    }
  }
  const omittedColumns = [schema.patients, schema.user, ...userTables, ...tablesWithPatientId().map((t) => t.table)].flatMap((t) =>
    Object.values(getTableColumns(t))
      .filter((c) => SECRET_COLUMN.test(c.name))
      .map((c) => `${getTableName(t)}.${c.name}`),
  );
  return {
    format: "caddis-patient-export/1",
    exportedAt: new Date().toISOString(),
    patientId,
    tables,
    accessLog: await accessLogInWords(patientId, patient.preferredLocale, tx),
    omittedColumns: [...new Set(omittedColumns)].sort(),
  };
}
