// The IANA time zones offered in pickers. Call on the server and pass the list down, so the
// options never differ between server and browser builds of the time zone data.
export function timeZoneOptions(...alsoInclude: (string | null | undefined)[]): string[] {
  const zones = new Set(Intl.supportedValuesOf("timeZone"));
  zones.add("UTC");
  for (const z of alsoInclude) if (z) zones.add(z);
  return [...zones].sort((a, b) => a.localeCompare(b));
}
