import { CairnMark } from "@/components/ui/cairn-mark";

export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <main className="flex min-h-screen items-center justify-center px-4">
      <div className="w-full max-w-md rounded-xl border border-line bg-paper p-8 shadow-sm">
        <div className="mb-6">
          <CairnMark size={36} />
          <p className="mt-2 text-sm text-ink-2">Evidence locker for inspection flights.</p>
        </div>
        {children}
      </div>
    </main>
  );
}
