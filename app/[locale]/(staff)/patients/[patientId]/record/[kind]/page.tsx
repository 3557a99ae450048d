import { getTranslations } from "next-intl/server";
import { notFound } from "next/navigation";
import { DeviceEpisodeForm, type BlockageHint, type PreviousDevice } from "@/components/episode-form/device-episode-form";
import { RemovalForm } from "@/components/episode-form/removal-form";
import { TwocForm } from "@/components/episode-form/twoc-form";
import { buttonClass } from "@/components/ui/button";
import { getRecordingContext, type EpisodeDto } from "@/db/queries/episodes";
import { getPlanDefaults } from "@/lib/config/settings";
import { Link } from "@/lib/i18n/navigation";
import { openRecordPage } from "@/lib/records/patient-record-page";
import { RECORD_KINDS, type RecordKind } from "@/lib/validations/episode";
import { deploymentTimeZone } from "@/lib/shared/time-zone";
import { blockagePatternOf } from "@/lib/shared/blockage-interval";

type Params = { locale: string; patientId: string; kind: string };

const isKind = (k: string): k is RecordKind => (RECORD_KINDS as readonly string[]).includes(k);

export async function generateMetadata({ params }: { params: Promise<Params> }) {
  const { kind } = await params;
  const t = await getTranslations("EpisodeForm");
  return { title: isKind(kind) ? t(`title.${kind}`) : t("title.insertion") };
}

function previousDevice(e: EpisodeDto | null): PreviousDevice | null {
  if (!e) return null;
  return {
    route: e.route,
    catheterType: e.catheterType,
    material: e.material,
    lengthCategory: e.lengthCategory,
    sizeCh: e.sizeCh,
    balloonMl: e.balloonMl,
    makerBalloonMl: e.makerBalloonMl,
    maker: e.maker,
    productName: e.productName,
    gelKind: e.gelKind,
    gelVolumeMl: e.gelVolumeMl,
    maxDwellDays: e.maxDwellDays,
    reviewIntervalDays: e.reviewIntervalDays,
    indication: e.indication,
    insertedAt: e.insertedAt,
  };
}

export default async function RecordEpisodePage({ params }: { params: Promise<Params> }) {
  const { locale, patientId, kind } = await params;
  if (!isKind(kind)) notFound();
  // Clinician role, access check and audit event before anything is read (the record layout
  // around this page shows the patient, their allergies and the tabs).
  const { viewer } = await openRecordPage({ locale, patientId, action: `episode.form.${kind}` });
  const [context, planning] = await Promise.all([getRecordingContext({ patientId }), getPlanDefaults()]);
  if (!context.patient) notFound();
  const { patient, active, latest } = context;
  const t = await getTranslations("EpisodeForm");
  const timeZone = deploymentTimeZone();
  const facts = { sex: patient.sex, dateOfBirth: patient.dateOfBirth, allergies: { latex: patient.allergies.latex, chlorhexidine: patient.allergies.chlorhexidine, lidocaine: patient.allergies.lidocaine } };
  const trial = latest && latest.removedAt && latest.awaitingTwoc && !active ? latest : null;

  let blockage: BlockageHint = null;
  if (kind === "change") {
    const pattern = blockagePatternOf(context.endings, timeZone, active ? (active.maxDwellDays ?? planning.maxDwellDays[active.material]) : undefined);
    if (pattern) blockage = { typicalDwellDays: pattern.typicalDwellDays, suggestedIntervalDays: pattern.suggestedIntervalDays, blockageEpisodes: pattern.blockageEpisodes };
  }

  const record = `/patients/${patientId}`;
  const blocked = (message: string, action?: { href: string; label: string }) => (
    <div className="flex max-w-2xl flex-col gap-4 rounded-card border-2 border-finding-info bg-finding-info-soft p-5" data-testid="record-blocked">
      <p className="font-bold">{message}</p>
      <div className="flex flex-wrap gap-3">
        {action ? (
          <Link href={action.href} className={buttonClass("primary")}>
            {action.label}
          </Link>
        ) : null}
        <Link href={record} className={buttonClass("secondary")}>
          {t("backToRecord")}
        </Link>
      </div>
    </div>
  );

  let body;
  if (patient.closed) body = blocked(t("blocked.closed"));
  else if (kind === "insertion") {
    body = active
      ? blocked(t("blocked.inPlace"), { href: `${record}/record/change`, label: t("title.change") })
      : <DeviceEpisodeForm mode="insertion" patientId={patientId} patient={facts} clinicianName={viewer.name} previous={previousDevice(latest)} timeZone={timeZone} blockage={null} planDefaults={planning} />;
  } else if (kind === "change") {
    body = active
      ? <DeviceEpisodeForm mode="change" patientId={patientId} patient={facts} clinicianName={viewer.name} previous={previousDevice(active)} timeZone={timeZone} blockage={blockage} planDefaults={planning} />
      : blocked(t("blocked.noneInPlace"), { href: `${record}/record/insertion`, label: t("title.insertion") });
  } else if (kind === "removal") {
    body = active
      ? <RemovalForm patientId={patientId} current={{ sizeCh: active.sizeCh, balloonMl: active.balloonMl, material: active.material, insertedAt: active.insertedAt, awaitingTwoc: active.awaitingTwoc }} />
      : blocked(t("blocked.noneInPlace"), { href: `${record}/record/insertion`, label: t("title.insertion") });
  } else {
    body = trial
      ? <TwocForm patientId={patientId} removedAt={trial.removedAt!} />
      : active
        ? blocked(t("blocked.twocInPlace"), { href: `${record}/record/removal`, label: t("title.removal") })
        : blocked(t("blocked.noTrial"));
  }

  return (
    <div className="flex flex-col gap-5">
      <div className="flex flex-col gap-1">
        <Link href={record} className="self-start font-bold text-brand underline underline-offset-4">
          {t("backToRecord")}
        </Link>
        <h2 className="text-2xl font-bold" data-testid="record-title">
          {t(`title.${kind}`)}
        </h2>
      </div>
      {body}
    </div>
  );
}
