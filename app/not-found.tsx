// An address no route knows (outside the workspace frame): the same words as inside it
// (components/shell/refusal.tsx), on the plain page of the sign-in screens.
import { Refusal } from "@/components/shell/refusal";
import { CairnMark } from "@/components/ui/cairn-mark";

export const metadata = { title: "Not found" };

export default function NotFound() {
  return (
    <main className="flex min-h-screen flex-col items-center justify-center gap-6 px-4">
      <CairnMark size={36} />
      <Refusal />
    </main>
  );
}
