// The mail that carries a share link to its recipients: who shares, what, until when, and whether
// a passcode (sent separately by the sender) is needed. Plain text and HTML. It promises only what
// the link holds at sending: footage, findings, a report (the contents come from loadShareScope).
import { composeMail, sendMail } from "@/lib/mail/send-mail";
import { formatMailDate } from "./format-mail-date";

export type ShareLinkMail = {
  to: string[];
  url: string;
  expiresAt: Date;
  organisationName: string;
  senderName: string;
  jobTitle: string;
  label: string;
  hasPasscode: boolean;
  /** what the link opens at the moment it is sent */
  contains: { recordings: number; findings: number; report: boolean };
};

/** "watch the footage, jump between the findings and download the report", as far as each is there. */
export function describeShareContents(c: ShareLinkMail["contains"]): string {
  const can = [
    ...(c.recordings > 0 ? [c.recordings === 1 ? "watch the recording" : "watch the recordings"] : []),
    ...(c.findings > 0 ? [c.findings === 1 ? "go to the finding" : "jump between the findings"] : []),
    ...(c.report ? ["download the report"] : []),
  ];
  if (can.length === 0) return "You can open the shared page; nothing is attached to it yet.";
  const list = can.length === 1 ? can[0] : `${can.slice(0, -1).join(", ")} and ${can[can.length - 1]}`;
  return `You can ${list}.`;
}

export function composeShareLinkMail(m: ShareLinkMail) {
  const paragraphs = [
    `${m.senderName} of ${m.organisationName} has shared inspection evidence with you: ${m.label} (${m.jobTitle}).`,
    `${describeShareContents(m.contains)} No account is needed. The link works until ${formatMailDate(m.expiresAt)}.`,
    ...(m.hasPasscode ? ["The link asks for a passcode. The sender gives it to you separately, not in this mail."] : []),
    "Anyone holding this link can open it: please do not forward it. Every opening and download is recorded.",
  ];
  return { subject: `${m.organisationName} shared: ${m.label}`, ...composeMail(paragraphs, { label: "Open the shared evidence", url: m.url }) };
}

export async function mailShareLink(m: ShareLinkMail): Promise<void> {
  await sendMail({ to: m.to, ...composeShareLinkMail(m) });
}
