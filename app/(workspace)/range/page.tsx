// /range: the slant range calculator, with the organisation's sites for its plan view.
import { pageMember } from "@/lib/auth/page-member";
import { loadPlanSites } from "@/lib/range-checks/load-range-page-data";
import { SlantRangeCalculator } from "@/components/range/slant-range-calculator";

export const metadata = { title: "Range & distance" };

export default async function RangePage() {
  const member = await pageMember("range.read");
  const sites = await loadPlanSites(member.organisationId);
  return <SlantRangeCalculator sites={sites} initialUnits={member.preferredUnits} />;
}
