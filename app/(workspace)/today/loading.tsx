// Shown while the start page's first numbers are read.
import { PageHeader } from "@/components/ui/page-header";
import { StartViewLoading } from "@/components/start/start-view";

export default function Loading() {
  return (
    <>
      <PageHeader title="Today" />
      <StartViewLoading />
    </>
  );
}
