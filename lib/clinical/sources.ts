/**
 * Every rule, threshold and default in lib/clinical names one of these sources.
 * `evidence` says how firmly it is known: "seen" in the source (or a faithful copy),
 * "recalled" (from memory, not verified), or "common-practice" (rule of thumb, no source).
 */
export type Evidence = "seen" | "recalled" | "common-practice";

export interface Source {
  readonly title: string;
  readonly evidence: Evidence;
}

export const SOURCES = {
  "rcp-news2-2017-chart1": {
    title: "Royal College of Physicians, National Early Warning Score 2 (2017), chart 1",
    evidence: "seen",
  },
  "rcp-news2-2017-chart3": {
    title: "Royal College of Physicians, National Early Warning Score 2 (2017), chart 3 (risk labels)",
    evidence: "recalled",
  },
  "rcp-news2-2017-chart4": {
    title: "Royal College of Physicians, National Early Warning Score 2 (2017), chart 4 (clinical response)",
    evidence: "seen",
  },
  "nice-ng51": {
    title: "NICE NG51 Sepsis: recognition, diagnosis and early management (2016, updated 2024), adult criteria",
    evidence: "seen",
  },
  "nice-ng113-1.1.1": {
    title: "NICE NG113 UTI (catheter-associated): antimicrobial prescribing (2018), 1.1.1",
    evidence: "seen",
  },
  "nice-ng113-1.1.3": {
    title: "NICE NG113 UTI (catheter-associated): antimicrobial prescribing (2018), 1.1.3",
    evidence: "seen",
  },
  "nice-qs90-s2": {
    title: "NICE QS90 Urinary tract infections in adults, statement 2 (no dipstick with a catheter)",
    evidence: "seen",
  },
  "idsa-cauti-2010": {
    title: "IDSA CA-UTI guideline, Hooton et al., Clin Infect Dis 2010;50:625-63",
    evidence: "seen",
  },
  "sign-160": {
    title: "SIGN 160 Management of suspected bacterial lower UTI in adult women (2020)",
    evidence: "seen",
  },
  "kdigo-aki-2012-table2": {
    title: "KDIGO Clinical Practice Guideline for Acute Kidney Injury (2012), table 2",
    evidence: "seen",
  },
  "rcn-2012-dwell": {
    title: "Long-term catheters up to 12 weeks per the maker (journal citing RCN 2012)",
    evidence: "seen",
  },
  "nhs-patient-catheter": {
    title: "NHS patient pages on urinary catheters (bags, valves, changes at least every 3 months)",
    evidence: "seen",
  },
  "handbook-balloon-10ml": {
    title: "Clinical handbook: 10 ml sterile water in the balloon for adults",
    evidence: "seen",
  },
  "secondary-size-12-14": {
    title: "Smallest size that drains well, usually 12-14 Ch for adults (secondary source; NICE, epic3, EAUN recalled)",
    evidence: "seen",
  },
  "iso-20696-5.5.2": {
    title: "ISO 20696:2018 clause 5.5.2 (Ch = 3 x outer diameter in mm; mm rounded up to 0.1)",
    evidence: "seen",
  },
  "gs1-genspecs": {
    title: "GS1 General Specifications: application identifiers, element strings, check digit (7.9.1)",
    evidence: "seen",
  },
  "gs1-genspecs-7.12": {
    title: "GS1 General Specifications section 7.12: century of a six-digit date",
    evidence: "recalled",
  },
  "eaun-2012-ch12": {
    title: "EAUN Catheterisation: indwelling catheters in adults (2012), chapter 12 (documentation)",
    evidence: "seen",
  },
  "mhra-mda-2012-075": {
    title: "MHRA MDA/2012/075: chlorhexidine in catheters and gels can cause anaphylaxis",
    evidence: "seen",
  },
  "latex-ask-before": {
    title: "Ask about latex allergy before catheterising",
    evidence: "seen",
  },
  "regional-fluids": {
    title: "Regional health service page: about 1.5-2 l of fluid a day unless a fluid limit applies",
    evidence: "seen",
  },
  "constipation-blockage": {
    title: "Constipation presses on the bladder and causes blockage, bypassing and spasm",
    evidence: "seen",
  },
  "common-practice": {
    title: "Common practice, no source",
    evidence: "common-practice",
  },
} as const satisfies Record<string, Source>;

export type SourceId = keyof typeof SOURCES;

