import { describe, expect, it } from "vitest";
import { beaconCollectionDomain } from "@/lib/playback-analytics/beacon-collection-domain";
import { muxBeaconUrlFunction } from "./mux-embed-source";

const beaconUrl = muxBeaconUrlFunction();
const loc = (href: string) => {
  const u = new URL(href);
  return { host: u.host, hostname: u.hostname, protocol: u.protocol };
};

describe("beaconCollectionDomain, run through mux-embed's own URL builder", () => {
  it("on a local http page, beacons go over plain http to the app's collector", () => {
    const domain = beaconCollectionDomain(loc("http://localhost:3249/recordings/x"))!;
    expect(beaconUrl("cairn-local", { beaconCollectionDomain: domain })).toBe("http://localhost:3249/api/collector?via=localhost");
    expect(beaconUrl("cairn-local", { beaconCollectionDomain: beaconCollectionDomain(loc("http://localhost/x"))! })).toBe("http://localhost/api/collector?via=localhost");
  });

  it("on an https host, beacons go over https to the same host's collector", () => {
    const domain = beaconCollectionDomain(loc("https://cairn.example:8443/recordings/x"))!;
    expect(beaconUrl("cairn-local", { beaconCollectionDomain: domain })).toBe("https://cairn.example:8443/api/collector");
  });

  it("on a plain-http host other than localhost, analytics stay off (the SDK would force https)", () => {
    expect(beaconCollectionDomain(loc("http://127.0.0.1:3100/x"))).toBeNull();
    // what would happen otherwise: mux-embed's builder chooses https for any non-localhost domain
    expect(beaconUrl("k", { beaconCollectionDomain: "127.0.0.1:3100/api/collector" })).toBe("https://127.0.0.1:3100/api/collector");
  });

  it("without a collection domain the SDK would post to a third party: we always set one", () => {
    expect(beaconUrl("abc123", {})).not.toContain("localhost");
  });
});
