// Sensible starting categories per kind of asset; each organisation edits its own copy.
// Common practice, no published source.
export const DEFAULT_CATEGORIES: { name: string; assetKind: "roof" | "tower" | "bridge" | "solar" | "facade" | "other" | null }[] = [
  { name: "Cracking", assetKind: null },
  { name: "Corrosion", assetKind: null },
  { name: "Missing or loose element", assetKind: null },
  { name: "Water ingress or staining", assetKind: null },
  { name: "Vegetation", assetKind: null },
  { name: "Slipped or missing slates/tiles", assetKind: "roof" },
  { name: "Flashing or gutter defect", assetKind: "roof" },
  { name: "Antenna or mount defect", assetKind: "tower" },
  { name: "Bolt or fixing defect", assetKind: "tower" },
  { name: "Bearing defect", assetKind: "bridge" },
  { name: "Spalling or exposed reinforcement", assetKind: "bridge" },
  { name: "Cracked panel glass", assetKind: "solar" },
  { name: "Soiling or shading", assetKind: "solar" },
  { name: "Render or cladding defect", assetKind: "facade" },
];
