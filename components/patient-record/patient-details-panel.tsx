"use client";
// The patient's details with an "Edit details" form in place (PATCH /api/patients/[id]).
import { useTranslations } from "next-intl";
import { useFormat } from "@/components/i18n/format";
import { useState } from "react";
import { PatientForm, type GpPractice } from "@/components/patient-form/patient-form";
import { Button } from "@/components/ui/button";
import type { PatientDetails } from "@/lib/shared/dto";
import { localeNames, type Locale } from "@/lib/i18n/routing";
import { ALLERGENS } from "@/lib/clinical/allergies";

export function PatientDetailsPanel({ patient, gpPractices, canEdit }: { patient: PatientDetails; gpPractices: GpPractice[]; canEdit: boolean }) {
  const t = useTranslations("PatientDevice");
  const tf = useTranslations("PatientForm");
  const v = useTranslations("Vocabulary");
  const format = useFormat();
  const [editing, setEditing] = useState(false);

  if (editing) {
    return (
      <PatientForm
        mode="edit"
        patientId={patient.id}
        gpPractices={gpPractices}
        onDone={() => setEditing(false)}
        initial={{
          givenName: patient.givenName,
          familyName: patient.familyName,
          healthRecordNumber: patient.healthRecordNumber,
          dateOfBirth: patient.dateOfBirth,
          sex: patient.sex,
          preferredLocale: patient.preferredLocale as Locale,
          weightKg: patient.weightKg,
          allergies: { ...patient.allergies, other: patient.allergies.other ?? "" },
          gpPracticeId: patient.gpPractice?.id ?? "",
          careTeamOrganisationIds: patient.careTeam.map((o) => o.id),
        }}
      />
    );
  }

  const allergies = [
    ...ALLERGENS.map((a) => `${v(`allergen.${a}`)}: ${tf(`allergyAnswer.${patient.allergies[a]}`)}`),
    ...(patient.allergies.other ? [`${tf("allergyOther")}: ${patient.allergies.other}`] : []),
  ];
  const rows: [string, string][] = [
    [tf("givenName"), patient.givenName],
    [tf("familyName"), patient.familyName],
    [tf("healthRecordNumber"), patient.healthRecordNumber],
    [tf("dateOfBirth"), format.dateTime(new Date(`${patient.dateOfBirth}T12:00:00Z`), { dateStyle: "long" })],
    [tf("sex"), v(`sex.${patient.sex}`)],
    [tf("preferredLocale"), localeNames[patient.preferredLocale as Locale] ?? patient.preferredLocale],
    [tf("weightKg"), patient.weightKg === null ? t("notRecorded") : t("kg", { kg: patient.weightKg })],
    [t("allergies"), allergies.join(" · ")],
    [tf("gpPractice"), patient.gpPractice ? `${patient.gpPractice.name}${patient.gpPractice.phone ? ` · ${patient.gpPractice.phone}` : ""}` : t("notRecorded")],
    [tf("careTeam"), patient.careTeam.map((o) => `${o.name}${o.phone ? ` · ${o.phone}` : ""}`).join("; ")],
  ];
  return (
    <div className="flex flex-col gap-4">
      <dl className="grid gap-x-6 gap-y-2 sm:grid-cols-[minmax(10rem,auto)_1fr]">
        {rows.map(([k, v]) => (
          <div key={k} className="contents">
            <dt className="font-bold text-ink-soft">{k}</dt>
            <dd className="tabular">{v}</dd>
          </div>
        ))}
      </dl>
      {canEdit ? (
        <div>
          <Button variant="secondary" onClick={() => setEditing(true)}>
            {t("editDetails")}
          </Button>
        </div>
      ) : null}
    </div>
  );
}
