// Outgoing mail through nodemailer: the local fake SMTP server by default, real SMTP by SMTP_URL.
import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import { env } from "@/lib/config/env";

let transport: Transporter | undefined;

function transporter(): Transporter {
  transport ??= nodemailer.createTransport(env().SMTP_URL);
  return transport;
}

export type Mail = { to: string | string[]; subject: string; text: string; html: string };

export async function sendMail(mail: Mail): Promise<void> {
  await transporter().sendMail({ from: env().MAIL_FROM, ...mail });
}

export function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

/** A plain, readable mail body in both text and HTML from paragraphs and one action link. */
export function composeMail(paragraphs: string[], action?: { label: string; url: string }): { text: string; html: string } {
  const text = [...paragraphs, ...(action ? [`${action.label}: ${action.url}`] : []), "", "Cairn"].join("\n\n");
  const html = [
    '<div style="font-family:sans-serif;color:#1d2430;max-width:560px">',
    ...paragraphs.map((p) => `<p>${escapeHtml(p)}</p>`),
    action
      ? `<p><a href="${escapeHtml(action.url)}" style="background:#0f6e7a;color:#fff;padding:10px 16px;border-radius:6px;text-decoration:none">${escapeHtml(action.label)}</a></p><p style="font-size:12px;color:#555">${escapeHtml(action.url)}</p>`
      : "",
    '<p style="font-size:12px;color:#555">Cairn</p></div>',
  ].join("");
  return { text, html };
}
