import "server-only";
// What the passport booklet prints: loaded by lib/passport from the record, never more.
import type { TranslationReview } from "@/lib/validations/settings";
import type { AllergyAnswers, CatheterType, EpisodeEventKind, LengthCategory, Material, Route, TwocOutcome, UnplannedReason } from "@/lib/clinical";

export type BookletDevice = {
  route: Route;
  catheterType: CatheterType;
  material: Material;
  lengthCategory: LengthCategory;
  sizeCh: number;
  /** Outer diameter from lib/clinical charriereToMm. */
  sizeMm: number;
  balloonMl: number;
  maker: string | null;
  productName: string | null;
  lot: string | null;
  /** YYYY-MM-DD */
  expiry: string | null;
  insertedAt: Date;
  insertedByName: string;
  organisationName: string | null;
  indication: string;
  /** YYYY-MM-DD, as stored from lib/clinical planDates when the episode was saved. */
  plannedChangeOn: string;
  reviewDueOn: string;
};

export type BookletEvent = {
  at: Date;
  kind: EpisodeEventKind;
  reason: UnplannedReason | null;
  twocOutcome: TwocOutcome | null;
  byName: string;
  organisationName: string | null;
  /** The catheter this event put in (insertions and changes). */
  sizeCh: number | null;
  material: Material | null;
  lot: string | null;
};

export type BookletChecklist = {
  taught: string[];
  suppliesGiven: boolean;
  suppliesDays: number | null;
  drainage: "valve" | "bag" | null;
  plannedTwocOn: string | null;
  firstVisitOn: string | null;
  portalActivationGiven: boolean;
};

type BookletContact = { name: string; phone: string | null; outOfHoursPhone: string | null };

export type PassportBookletData = {
  /** [patient's language, "en"], or ["en"] alone. */
  locales: string[];
  /** The deployment's region for dates and numbers (Settings), or null. */
  region: string | null;
  /** Per translated language, the medical translator's review (Settings); missing: not reviewed. */
  translationReviews: Partial<Record<string, TranslationReview>>;
  url: string;
  shortCode: string;
  qrPngDataUrl: string;
  issuedAt: Date;
  issuedByName: string;
  patient: {
    givenName: string;
    familyName: string;
    /** YYYY-MM-DD */
    dateOfBirth: string;
    healthRecordNumber: string;
    allergies: AllergyAnswers & { other: string | null };
  };
  device: BookletDevice | null;
  history: BookletEvent[];
  contacts: {
    emergencyNumber: string;
    outOfHoursServiceName: string | null;
    careTeams: BookletContact[];
    gp: BookletContact | null;
  };
  /** The latest discharge checklist (null when none): printed with what was not done said plainly. */
  checklist?: BookletChecklist | null;
  /**
   * The copy a patient or carer downloads from the portal: no QR or passport code (those are on
   * the printed booklet only), and the patient pages in the reader's own text size and contrast.
   */
  readerCopy?: { textScale: number; highContrast: boolean } | null;
  /** A one-time portal activation code, printed on its own page; never on the stored copy. */
  portalActivation?: { code: string; expiresAt: Date; activateUrl: string } | null;
};
