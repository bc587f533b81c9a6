// The altitude caution beside an altitude figure, when the height is above the common 120 m / 400 ft
// limit: a quiet bordered box, never a modal (docs/look.md, "Cautions").
import { Caution } from "@/components/ui/caution";
import { altitudeCautionsToShow } from "@/lib/filing/format-altitude";

export function AltitudeCautions({ metres }: { metres: number | null | undefined }) {
  const cautions = altitudeCautionsToShow(metres);
  if (!cautions.length) return null;
  return (
    <div className="flex flex-col gap-2" data-testid="altitude-caution">
      {cautions.map((c) => (
        <Caution key={c.id} summary={c.summary} detail={c.detail} sources={[...c.sources]} />
      ))}
    </div>
  );
}
