// The small pages a share link answers with before (or instead of) the viewer: unknown link (404),
// expired or revoked link (410), the passcode form (200), a refused passcode (404). Self-contained
// HTML with the theme's colours inline: these answers need a real status code, which a React page
// cannot set, and no script at all. Nothing on them names a record the visitor could not already see.
import { escapeHtml } from "@/lib/mail/send-mail";
import { SHARE_RESPONSE_HEADERS } from "./share-response-headers";

export type GateKind = "unknown" | "expired" | "revoked" | "passcode" | "passcode-refused" | "limited";

const STATUS: Record<GateKind, number> = { unknown: 404, expired: 410, revoked: 410, passcode: 200, "passcode-refused": 404, limited: 429 };

const MARK = `<svg width="36" height="36" viewBox="0 0 32 32" aria-hidden="true"><rect x="6" y="22" width="20" height="7" rx="3.5" fill="#1d2430"/><rect x="9" y="14.5" width="14" height="6.5" rx="3.25" fill="#1d2430"/><rect x="12" y="7.5" width="8" height="6" rx="3" fill="#0f6e7a"/></svg>`;

const STYLE = `
body{margin:0;background:#f7f6f2;color:#1d2430;font:16px/1.5 "IBM Plex Sans",ui-sans-serif,system-ui,sans-serif}
main{max-width:30rem;margin:10vh auto;padding:2rem;border:1px solid #c9c5ba;border-radius:12px;background:#f7f6f2}
h1{font-size:1.35rem;margin:1rem 0 .5rem}
p{margin:.5rem 0;color:#4a5361}
.state{display:inline-block;margin-top:1rem;padding:.15rem .5rem;border:1px solid #1d2430;border-radius:4px;font-size:.8rem;font-weight:600;color:#1d2430}
label{display:block;margin-top:1.25rem;font-weight:600;font-size:.9rem}
input{box-sizing:border-box;width:100%;min-height:2.75rem;margin-top:.25rem;padding:.5rem .75rem;border:1px solid #c9c5ba;border-radius:6px;font:inherit;background:#fff;color:#1d2430}
button{margin-top:1rem;min-height:2.75rem;padding:.5rem 1rem;border:1px solid #0f6e7a;border-radius:6px;background:#0f6e7a;color:#fff;font:inherit;font-weight:600;cursor:pointer}
:focus-visible{outline:3px solid #0f6e7a;outline-offset:2px}
.alert{margin-top:1rem;padding:.5rem .75rem;border:1px solid #9b1c1c;border-radius:6px;background:#fbe4e4;color:#1d2430}
footer{margin-top:1.5rem;font-size:.8rem;color:#4a5361}
@media (prefers-color-scheme:dark){body,main{background:#161b23;color:#eef0f3}p,footer{color:#b7bfcb}.state{border-color:#eef0f3;color:#eef0f3}input{background:#202733;color:#eef0f3;border-color:#3b4554}}
`;

type GateOptions = { organisationName?: string; endedAt?: Date | null; retryAfterSec?: number };

function content(kind: GateKind, o: GateOptions): { title: string; state: string; body: string } {
  const from = o.organisationName ? ` from ${escapeHtml(o.organisationName)}` : "";
  const form = (alert: string) => `
    ${alert}
    <form method="post" autocomplete="off">
      <label for="passcode">Passcode</label>
      <input id="passcode" name="passcode" type="password" required maxlength="64" autofocus>
      <button type="submit">Open the shared evidence</button>
    </form>`;
  switch (kind) {
    case "unknown":
      return {
        title: "This link does not open anything",
        state: "Not found",
        body: "<p>The address may be mistyped or incomplete. Copy the whole link from the mail you received, or ask the sender for a new one.</p>",
      };
    case "expired":
      return {
        title: "This share link has expired",
        state: "Expired",
        body: `<p>The evidence shared${from} was available until ${o.endedAt ? escapeHtml(o.endedAt.toISOString().slice(0, 10)) : "an earlier date"}. Ask the sender for a new link if you still need it.</p>`,
      };
    case "revoked":
      return {
        title: "This share link has been revoked",
        state: "Revoked",
        body: `<p>The sender${from} has withdrawn this link, so it no longer opens. Ask them for a new link if you still need the evidence.</p>`,
      };
    case "passcode":
      return {
        title: "Enter the passcode",
        state: "Passcode needed",
        body: `<p>The evidence shared${from} is protected by a passcode. The sender gives it to you separately from the link.</p>${form("")}`,
      };
    case "passcode-refused":
      return {
        title: "That passcode did not open this link",
        state: "Not opened",
        body: `<p>Check the passcode and try again. After several wrong tries from here, this page asks you to wait a while before the next one.</p>${form('<p class="alert" role="alert">The passcode was not accepted.</p>')}`,
      };
    case "limited": {
      const sec = o.retryAfterSec ?? 60;
      const wait = sec < 90 ? `${sec} seconds` : `${Math.ceil(sec / 60)} minutes`;
      return {
        title: "Too many tries from here",
        state: "Please wait",
        body: `<p>Wait ${escapeHtml(wait)} before the next try. Tries from other places do not count against you.</p>`,
      };
    }
  }
}

export function shareGateResponse(kind: GateKind, options: GateOptions = {}, extraHeaders: Record<string, string> = {}): Response {
  const c = content(kind, options);
  const html = `<!doctype html>
<html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<meta name="robots" content="noindex, nofollow"><meta name="referrer" content="no-referrer">
<title>${escapeHtml(c.title)} · Cairn</title><style>${STYLE}</style></head>
<body><main data-gate="${kind}">${MARK}<span class="state">${escapeHtml(c.state)}</span><h1>${escapeHtml(c.title)}</h1>${c.body}
<footer>Cairn · shared inspection evidence</footer></main></body></html>`;
  return new Response(html, {
    status: STATUS[kind],
    headers: { ...SHARE_RESPONSE_HEADERS, "Content-Type": "text/html; charset=utf-8", ...extraHeaders },
  });
}
