export const metadata = { title: "Jobs" };
export default function JobsPage() {
  return <h1 className="text-2xl font-semibold">Jobs</h1>;
}
