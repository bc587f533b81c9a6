// Our severity words for a finding, each with a written meaning, the FHWA National Bridge Inventory
// condition rating it corresponds to (Recording and Coding Guide, items 58-62; 0 Failed .. 9 Excellent),
// and the outline thickness of its stone-shaped timeline marker (docs/look.md: thicker outline, worse finding).
//
// The NBI rates a whole component, we rate one observed defect: the number says "a component showing
// this defect would rate no better than N". We keep our own words because crews inspect roofs, towers
// and panels as well as bridges; the number anchors each word on a published scale.
export const SEVERITIES = ["note", "minor", "moderate", "major", "severe", "critical"] as const;
export type Severity = (typeof SEVERITIES)[number];

export type SeverityLevel = {
  readonly value: Severity;
  readonly label: string;
  readonly meaning: string;
  /** FHWA NBI condition rating (0-9) this level maps to */
  readonly nbiRating: number;
  /** the NBI's own word for that rating */
  readonly nbiWord: string;
  /** stroke width of the stone marker outline, px */
  readonly outlinePx: number;
};

export const SEVERITY_SCALE: Readonly<Record<Severity, SeverityLevel>> = {
  note: {
    value: "note",
    label: "Note",
    meaning: "Worth recording, no defect: context, a reference view, or something to look at again next time.",
    nbiRating: 8,
    nbiWord: "Very good", // 8 = "Very good: no problems noted" (recalled from memory)
    outlinePx: 1,
  },
  minor: {
    value: "minor",
    label: "Minor",
    meaning: "Small, superficial defect with no effect on function. Monitor at the next routine inspection.",
    nbiRating: 7,
    nbiWord: "Good", // 7 = "Good: some minor problems" (recalled from memory)
    outlinePx: 1.5,
  },
  moderate: {
    value: "moderate",
    label: "Moderate",
    meaning: "Deterioration that is sound for now but will grow: plan a repair within the maintenance cycle.",
    nbiRating: 5,
    nbiWord: "Fair", // 5 = Fair (FHWA Recording and Coding Guide; docs/outside-checks.md)
    outlinePx: 2,
  },
  major: {
    value: "major",
    label: "Major",
    meaning: "Advanced deterioration or section loss: schedule a repair soon and check again before then.",
    nbiRating: 4,
    nbiWord: "Poor", // 4 = Poor; overall Poor is 0-4 (FHWA good/fair/poor; docs/outside-checks.md)
    outlinePx: 2.75,
  },
  severe: {
    value: "severe",
    label: "Severe",
    meaning: "The defect seriously affects a primary element; local failure is possible. Act promptly and restrict use if in doubt.",
    nbiRating: 3,
    nbiWord: "Serious", // 3 = Serious (FHWA Recording and Coding Guide)
    outlinePx: 3.5,
  },
  critical: {
    value: "critical",
    label: "Critical",
    meaning: "Failure is possible without prompt action: tell the asset owner today and keep people clear until it is made safe.",
    nbiRating: 2,
    nbiWord: "Critical", // 2 = Critical (FHWA Recording and Coding Guide)
    outlinePx: 4.5,
  },
};

/** Worst first: the order of lists and report counts. */
export const SEVERITIES_WORST_FIRST: readonly Severity[] = [...SEVERITIES].reverse();

export function isSeverity(value: unknown): value is Severity {
  return typeof value === "string" && (SEVERITIES as readonly string[]).includes(value);
}
