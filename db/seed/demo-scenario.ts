// The invented demo scenario (docs/product-rules.md): a fictional crew, fictional clients, made-up sites in open
// country. Every name here is invented; the e-mail domain is reserved for examples (RFC 2606).
export const DEMO_PASSWORD = "cairn-demo-2026";

export const DEMO_ORG = { name: "Kestrelmoor Aerial Survey", slug: "kestrelmoor", timeZone: "Europe/London" };

export const DEMO_USERS = [
  { key: "owner", email: "owner@kestrelmoor.example", name: "Ada Thornbury", role: "owner" },
  { key: "pilot", email: "pilot@kestrelmoor.example", name: "Bram Ellery", role: "pilot" },
  { key: "reviewer", email: "reviewer@kestrelmoor.example", name: "Cleo Marchbank", role: "reviewer" },
  { key: "client", email: "client@kestrelmoor.example", name: "Dara Penhallow", role: "client" },
] as const;

// the demo client account sees the work of this client only (membership_clients)
export const DEMO_CLIENT_ACCOUNT_CLIENTS = ["water"] as const;

// a second, unrelated organisation: its records must never show in the first one
export const OTHER_ORG = { name: "Harrowfell Drone Works", slug: "harrowfell", timeZone: "UTC" };
export const OTHER_USER = { email: "owner@harrowfell.example", name: "Evan Quarrie", role: "owner" } as const;

export const DEMO_CLIENTS = [
  { key: "water", name: "Fennmarsh Water Utility", contactName: "Gwen Aldridge", contactEmail: "assets@fennmarsh-water.example", notes: "Reservoir towers and spillway bridges." },
  { key: "property", name: "Quillbury Property Management", contactName: "Hal Winterbourne", contactEmail: "claims@quillbury.example", notes: "Roof surveys after storms; insurance claims." },
  { key: "solar", name: "Brightmoor Solar Co-operative", contactName: "Iris Fairweather", contactEmail: "ops@brightmoor-solar.example", notes: "Panel rows and inverter housings." },
] as const;

export const DEMO_SITES = [
  { key: "tower", client: "water", name: "Lowfen reservoir valve tower", address: "1 Reservoir Track, Lowfen (invented)", latitude: 54.41237, longitude: -2.61942, assetKind: "tower", launchNotes: "Launch from the gravel pad north of the gate; keep off the dam crest." },
  { key: "bridge", client: "water", name: "Spillway footbridge", address: "Spillway Lane, Lowfen (invented)", latitude: 54.40811, longitude: -2.62517, assetKind: "bridge", launchNotes: "Overhead line 120 m east." },
  { key: "roof", client: "property", name: "Wychcombe Terrace roofs", address: "14-22 Wychcombe Terrace (invented)", latitude: 54.38102, longitude: -2.58833, assetKind: "roof", launchNotes: "Rear car park; notify residents." },
  { key: "solar", client: "solar", name: "Brightmoor array B", address: "Brightmoor Farm, Moor Road (invented)", latitude: 54.45520, longitude: -2.70410, assetKind: "solar", launchNotes: "Sheep in the east field; close the gate." },
] as const;

export const DEMO_JOBS = [
  { key: "tower-annual", site: "tower", title: "Valve tower annual inspection", scope: "Masonry, ladder cages, aerial mounts, roof.", status: "review", dueInDays: 10 },
  { key: "bridge-check", site: "bridge", title: "Footbridge bearing check", scope: "Bearings and deck underside after flood.", status: "fieldwork", dueInDays: 21 },
  { key: "roof-claim", site: "roof", title: "Storm damage claim, terrace roofs", scope: "Slipped and missing slates, flashing, gutters.", status: "planned", dueInDays: 5 },
  { key: "solar-survey", site: "solar", title: "Array B panel survey", scope: "Cracked glass, soiling, hot junction boxes (visual only).", status: "delivered", dueInDays: -14 },
] as const;

export const DEMO_FLIGHTS = [
  { key: "tower-f1", job: "tower-annual", daysAgo: 3, aircraft: "Quad, 5 in props (demo airframe A)", maxAltitudeAglM: 61, launch: [54.41301, -2.61955], notes: "Wind 12 kt from the west; link faded behind the tower, the picture broke up and the video was lost for a few seconds (the recorder started a second file)." },
  { key: "tower-f2", job: "tower-annual", daysAgo: 3, aircraft: "Quad, 5 in props (demo airframe A)", maxAltitudeAglM: 45, launch: [54.41301, -2.61955], notes: "Second battery: roof and aerial mounts." },
  { key: "bridge-f1", job: "bridge-check", daysAgo: 1, aircraft: "Ducted quad (demo airframe B)", maxAltitudeAglM: 18, launch: [54.40790, -2.62460], notes: "Under-deck passes at walking pace." },
  { key: "solar-f1", job: "solar-survey", daysAgo: 30, aircraft: "Hex, survey camera (demo airframe C)", maxAltitudeAglM: 40, launch: [54.45480, -2.70300], notes: "" },
] as const;
