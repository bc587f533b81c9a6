import Link from "next/link";

export const metadata = { title: "Check your mail" };

export default function CheckMail() {
  return (
    <div className="flex flex-col gap-3">
      <h1 className="text-xl font-semibold">Check your mail</h1>
      <p className="text-sm">
        If this address belongs to a Cairn account, a sign-in link is on its way. It works once, for 15 minutes.
      </p>
      <Link href="/sign-in" className="text-sm text-lake underline">
        Back to sign-in
      </Link>
    </div>
  );
}
