import "server-only";
// The request to the GP practice to prescribe a period's catheter supplies, in the practice's
// language, with the catheter's specification so the right product is prescribed.
import type { Executor } from "@/db";
import { getRegion } from "@/lib/config/settings";
import { getCareTeamOrganisations } from "@/db/queries/mail-context";
import type { CatheterEpisode, Organisation, Patient, SupplyRequest } from "@/db/schema";
import { allergyText, careTeamLines } from "./gp-summary";
import { emailDates, emailLocale, emailTranslator, emailVocabulary } from "./i18n";
import { queueMessage } from "./outbox";
import { renderEmail, type Block } from "./render";

export async function queueSupplyRequestEmail(
  tx: Executor,
  {
    request,
    patient,
    episode,
    gp,
    actorName,
    createdByUserId,
  }: {
    request: SupplyRequest;
    patient: Patient;
    episode: CatheterEpisode;
    gp: Organisation | null;
    actorName: string;
    createdByUserId: string;
  },
) {
  const locale = emailLocale(gp?.locale);
  const t = emailTranslator(locale);
  const v = emailVocabulary(locale);
  const d = emailDates(locale, await getRegion(tx));
  const team = await getCareTeamOrganisations({ patientId: patient.id }, tx);
  // The gel named is the one used at the last insertion or change.
  const itemName = (item: string) =>
    item === "gel" && episode.gelKind !== "none" ? `${v("supplyItem.gel")}: ${v(`gelKind.${episode.gelKind}`)}` : v(`supplyItem.${item as "gel"}`);
  const basis = (item: string, interval: number) => {
    if (item === "catheter") return t("supply.basisCatheter", { days: interval });
    if (item === "gel") return t("supply.basisGel");
    if (item === "night-bag") return t("supply.basisNight");
    return t("supply.basisEvery", { days: interval });
  };
  const spec = t("supply.specValue", {
    route: v(`route.${episode.route}`),
    type: v(`catheterType.${episode.catheterType}`),
    material: v(`material.${episode.material}`),
    length: v(`lengthCategory.${episode.lengthCategory}`),
    ch: episode.sizeCh,
    ml: episode.balloonMl,
  });
  const blocks: Block[] = [
    { type: "heading", text: t("gp.patient") },
    {
      type: "facts",
      rows: [
        { label: t("gp.name"), value: `${patient.givenName} ${patient.familyName}` },
        { label: t("gp.dateOfBirth"), value: d.short(patient.dateOfBirth) },
        { label: t("gp.healthRecordNumber"), value: patient.healthRecordNumber },
        {
          label: t("gp.allergies"),
          value: allergyText(t, v, { latex: patient.allergyLatex, chlorhexidine: patient.allergyChlorhexidine, lidocaine: patient.allergyLidocaine, other: patient.allergyOther }),
        },
      ],
    },
    { type: "heading", text: t("supply.itemsHeading", { days: request.periodDays }) },
    {
      type: "table",
      head: [t("supply.colItem"), t("supply.colQuantity"), t("supply.colBasis")],
      rows: request.items
        .filter((i) => i.quantity > 0)
        .map((i) => [itemName(i.item), String(i.quantity), basis(i.item, i.intervalDays)]),
    },
    // What a planned trial without catheter in the period would make unnecessary if it passes.
    ...(episode.twocPlannedOn
      ? [{ type: "paragraph" as const, text: t("supply.afterTrial", { date: d.day(episode.twocPlannedOn) }) }]
      : []),
    { type: "heading", text: t("supply.specHeading") },
    {
      type: "facts",
      rows: [
        { label: t("supply.spec"), value: spec },
        ...(episode.maker || episode.productName
          ? [{ label: v("device.maker"), value: [episode.maker, episode.productName].filter(Boolean).join(", ") }]
          : []),
        { label: t("device.plannedChange"), value: d.day(episode.plannedChangeOn) },
      ],
    },
  ];
  if (request.note) blocks.push({ type: "heading", text: t("supply.noteHeading") }, { type: "paragraph", text: request.note });
  if (team.length) blocks.push({ type: "heading", text: t("gp.careTeamHeading") }, { type: "list", items: careTeamLines(t, team) });
  const content = {
    locale,
    subject: t("supply.subject", { hrn: patient.healthRecordNumber }),
    title: t("supply.title"),
    intro: t("supply.intro", { actor: actorName, patient: `${patient.givenName} ${patient.familyName}`, days: request.periodDays }),
    blocks,
    footer: [t("supply.footerWhy"), t("common.footerNoReply"), t("common.footerSafety")],
  };
  return queueMessage(tx, {
    idempotencyKey: `supply-request:${request.id}`,
    kind: "supply-request",
    to: gp?.inboxEmail ?? null,
    ...renderEmail(content),
    patientId: patient.id,
    organisationId: gp?.id ?? null,
    locale,
    sourceId: request.id,
    createdByUserId,
  });
}
