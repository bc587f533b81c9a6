// A position in decimal degrees, in mono (docs/look.md: anything exact is mono), or a dash.
export function Coordinates({ lat, lon }: { lat: number | null; lon: number | null }) {
  if (lat == null || lon == null) return <span className="text-ink-2">—</span>;
  return (
    <span className="font-mono text-xs whitespace-nowrap">
      {lat.toFixed(5)}°, {lon.toFixed(5)}°
    </span>
  );
}
