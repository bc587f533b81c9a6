// The mail that carries a share link to its recipients: who shares, what, until when, and whether
// a passcode (sent separately by the sender) is needed. Plain text and HTML.
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
};

export function composeShareLinkMail(m: ShareLinkMail) {
  const paragraphs = [
    `${m.senderName} of ${m.organisationName} has shared inspection evidence with you: ${m.label} (${m.jobTitle}).`,
    `You can watch the footage, jump between the findings and download the report. No account is needed. The link works until ${formatMailDate(m.expiresAt)}.`,
    ...(m.hasPasscode ? ["The link asks for a passcode. The sender gives it to you separately, not in this mail."] : []),
    "Anyone holding this link can open it: please do not forward it. Every opening and download is recorded.",
  ];
  return { subject: `${m.organisationName} shared: ${m.label}`, ...composeMail(paragraphs, { label: "Open the shared evidence", url: m.url }) };
}

export async function mailShareLink(m: ShareLinkMail): Promise<void> {
  await sendMail({ to: m.to, ...composeShareLinkMail(m) });
}
