// GET /dev/mailbox: the messages the local fake SMTP server received, newest first, with their links
// clickable. Development and local runs only; a production server answers 404.
import Link from "next/link";
import { notFound } from "next/navigation";
import { readMailbox } from "@/lib/mail/read-mailbox";
import { CairnMark } from "@/components/ui/cairn-mark";
import { devMailboxEnabled } from "./dev-mailbox-enabled";

export const dynamic = "force-dynamic";
export const metadata = { title: "Development mailbox", robots: { index: false } };

const URL_PATTERN = /(https?:\/\/[^\s<>"]+)/g;

/** Plain mail text with its web addresses as links; everything else stays text (React escapes it). */
function Linked({ text }: { text: string }) {
  const parts = text.split(URL_PATTERN);
  return (
    <>
      {parts.map((p, i) =>
        i % 2 === 1 ? (
          <a key={i} href={p} className="break-all text-lake underline">
            {p}
          </a>
        ) : (
          <span key={i}>{p}</span>
        ),
      )}
    </>
  );
}

export default async function MailboxPage({ searchParams }: { searchParams: Promise<{ to?: string | string[] }> }) {
  if (!devMailboxEnabled()) notFound();
  const raw = (await searchParams).to;
  const to = typeof raw === "string" && raw.trim() ? raw.trim().toLowerCase() : undefined;
  const mails = await readMailbox({ to, limit: 100 });
  return (
    <main className="mx-auto flex max-w-4xl flex-col gap-5 px-4 py-8">
      <div className="flex flex-wrap items-end gap-4">
        <CairnMark />
        <div>
          <h1 className="text-2xl font-semibold tracking-tight">Development mailbox</h1>
          <p className="text-sm text-ink-2">
            Mail the local fake SMTP server received (stored under <span className="font-mono">.data/mail</span>), newest first. Nothing here was sent to anyone.
          </p>
        </div>
      </div>
      <form className="flex flex-wrap items-end gap-2" method="get">
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-medium">Recipient</span>
          <input name="to" type="email" defaultValue={to ?? ""} placeholder="owner@kestrelmoor.example" className="min-h-10 w-72 rounded-md border border-line bg-white px-3 text-sm dark:bg-paper-2" />
        </label>
        <button type="submit" className="min-h-10 rounded-md border border-lake bg-lake px-4 text-sm font-medium text-white">
          Show
        </button>
        {to && (
          <Link href="/dev/mailbox" className="min-h-10 px-2 py-2 text-sm text-lake underline">
            All recipients
          </Link>
        )}
      </form>
      {mails.length === 0 ? (
        <p className="rounded-lg border border-dashed border-line px-6 py-10 text-center text-sm text-ink-2">
          {to ? `No mail for ${to}.` : "No mail yet."} Ask for a sign-in link or invite someone, then reload this page.
        </p>
      ) : (
        <ol className="flex flex-col gap-4" aria-label="Messages">
          {mails.map((m) => (
            <li key={m.id} className="rounded-lg border border-line bg-paper p-4">
              <article aria-label={m.subject}>
                <h2 className="font-semibold">{m.subject || "(no subject)"}</h2>
                <dl className="mt-1 grid grid-cols-[auto_1fr] gap-x-3 text-xs text-ink-2">
                  <dt>To</dt>
                  <dd>{m.to.join(", ")}</dd>
                  <dt>From</dt>
                  <dd>{m.from}</dd>
                  <dt>Received</dt>
                  <dd className="font-mono">{m.receivedAt.replace("T", " ").replace(/\.\d+Z$/, " UTC")}</dd>
                </dl>
                <pre className="mt-3 whitespace-pre-wrap font-sans text-sm">
                  <Linked text={m.text} />
                </pre>
              </article>
            </li>
          ))}
        </ol>
      )}
    </main>
  );
}
