// Where the player's analytics SDK sends its beacons: the app's own collector route, never a third party.
//
// mux-embed builds the beacon URL as ("http://" if the domain ends in `localhost[:port]`, else "https://")
// + beaconCollectionDomain, and POSTs to exactly that URL (mux-embed 5.x, function building the beacon
// URL). So a path can ride in the "domain": on https hosts "host/api/collector" becomes
// https://host/api/collector. On a local http host the string must still end in "localhost" to keep
// plain http, hence the `?via=localhost` query the collector ignores.
export const COLLECTOR_PATH = "/api/collector";

export function beaconCollectionDomain(location: { host: string; hostname: string; protocol: string }): string | null {
  if (location.hostname === "localhost") return `${location.host}${COLLECTOR_PATH}?via=localhost`;
  // anything else gets https from the SDK: only right when the page itself is https
  if (location.protocol === "https:") return `${location.host}${COLLECTOR_PATH}`;
  return null;
}
