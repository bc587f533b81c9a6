// The IANA zone names this browser knows, for the time-zone picker (UTC is not always in the list).
export const TIME_ZONES: string[] = (() => {
  const list = typeof Intl.supportedValuesOf === "function" ? Intl.supportedValuesOf("timeZone") : [];
  return list.includes("UTC") ? list : ["UTC", ...list];
})();
