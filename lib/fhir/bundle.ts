import "server-only";
// Loads a patient's rows and builds their FHIR Bundle, addressed from APP_URL. The caller has
// checked access and writes its own audit event.
import { getFhirExportData } from "@/db/queries/fhir-export";
import { env } from "@/lib/config/env";
import { translatorFor } from "@/lib/i18n/catalogues";
import { AppError } from "@/lib/http/errors";
import type { TwocFailedAction, TwocSymptom } from "@/lib/clinical";
import { buildFhirBundle } from "./export";

export async function patientFhirBundle({ patientId }: { patientId: string }) {
  const data = await getFhirExportData({ patientId });
  if (!data) throw new AppError("not_found");
  // The export is in English, as its other texts are.
  const v = translatorFor("en", "Vocabulary");
  const words = { symptom: (s: TwocSymptom) => v(`twocSymptom.${s}`), failedAction: (a: TwocFailedAction) => v(`failedAction.${a}`) };
  return buildFhirBundle({ ...data, identifierSystem: env.FHIR_HRN_SYSTEM, words });
}
