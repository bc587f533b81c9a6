// The safety cautions beside a range or altitude figure: quiet boxes, full text on demand, never a modal.
import { Caution } from "@/components/ui/caution";
import { rangeCheckCautions } from "@/lib/geo";

export function SafetyCautions({ heightAglM }: { heightAglM: number | null }) {
  // without a height the altitude caution cannot be judged; the link and local-rule cautions always apply
  const cautions = rangeCheckCautions(heightAglM !== null && Number.isFinite(heightAglM) && heightAglM >= 0 ? heightAglM : 0);
  return (
    <div role="group" className="flex flex-col gap-2" aria-label="Safety cautions">
      {cautions.map((c) => (
        <Caution key={c.id} summary={c.summary} detail={c.detail} sources={[...c.sources]} />
      ))}
    </div>
  );
}
