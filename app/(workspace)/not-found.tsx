// Inside the workspace frame: any page that calls notFound() (a record that does not exist or is not
// this member's, a page outside the member's role: lib/auth/page-member.ts) answers 404 with this.
import { Refusal } from "@/components/shell/refusal";

export const metadata = { title: "Not found" };

export default function WorkspaceNotFound() {
  return <Refusal />;
}
