// The flight form works in feet or metres; what it sends is metres, exactly.
import { describe, expect, it } from "vitest";
import { altitudeForForm, flightForm, flightFormToInput } from "@/lib/validation/flight-form";
import { flightInput } from "@/lib/validation/work";

const id = "6f1c2b8e-3d4a-4c5b-9e6f-7a8b9c0d1e2f";
const base = { jobId: id, flownOn: "2026-03-14", pilotId: "", aircraft: "", launchLatitude: "", launchLongitude: "", launchNotes: "", notes: "" };

describe("flight form", () => {
  it("400 ft becomes 121.92 m exactly", () => {
    // NIST SP 811 Appendix B: 1 ft = 0.3048 m exactly, so 400 ft = 121.92 m
    const values = flightForm("ft").parse({ ...base, maxAltitude: "400" });
    const input = flightFormToInput(values, "ft");
    expect(input.maxAltitudeAglM).toBe(121.92);
    expect(flightInput.parse(input).maxAltitudeAglM).toBe(121.92);
  });

  it("metres pass through unchanged; an empty field means no altitude", () => {
    expect(flightFormToInput(flightForm("m").parse({ ...base, maxAltitude: "61" }), "m").maxAltitudeAglM).toBe(61);
    expect(flightFormToInput(flightForm("ft").parse({ ...base, maxAltitude: "" }), "ft").maxAltitudeAglM).toBeNull();
  });

  it("bounds the altitude in the form's own unit (10 000 m = 32 808.4 ft)", () => {
    expect(flightForm("ft").safeParse({ ...base, maxAltitude: "32808" }).success).toBe(true);
    expect(flightForm("ft").safeParse({ ...base, maxAltitude: "32809" }).success).toBe(false);
    expect(flightForm("m").safeParse({ ...base, maxAltitude: "10001" }).success).toBe(false);
    expect(flightForm("m").safeParse({ ...base, maxAltitude: "-1" }).success).toBe(false);
  });

  it("shows stored metres in the member's unit to a tenth", () => {
    expect(altitudeForForm(121.92, "ft")).toBe("400");
    expect(altitudeForForm(61, "ft")).toBe("200.1"); // 61 / 0.3048 = 200.131...
    expect(altitudeForForm(61, "m")).toBe("61");
    expect(altitudeForForm(null, "ft")).toBe("");
  });

  it("an altitude the person did not touch is sent back as stored, not as the rounded figure shown", () => {
    const values = flightForm("ft").parse({ ...base, maxAltitude: altitudeForForm(61, "ft") });
    expect(flightFormToInput(values, "ft").maxAltitudeAglM).not.toBe(61); // 200.1 ft = 60.99048 m: the drift this avoids
    expect(flightFormToInput(values, "ft", 61).maxAltitudeAglM).toBe(61);
  });

  it("keeps the pair rule for the launch point", () => {
    const r = flightForm("m").safeParse({ ...base, launchLatitude: "54.4" });
    expect(r.success).toBe(false);
    expect(r.error!.issues.map((i) => i.path.join("."))).toEqual(["launchLongitude"]);
  });
});
