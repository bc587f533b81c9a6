// Local fake mail server: accepts any SMTP message on loopback and stores it as JSON under .data/mail,
// where the dev mailbox page and the tests read it. Never relays anything.
import { SMTPServer } from "smtp-server";
import { simpleParser } from "mailparser";
import { mkdirSync, writeFileSync, renameSync } from "node:fs";
import path from "node:path";
import { randomUUID } from "node:crypto";

const port = Number(process.env.CAIRN_SMTP_PORT ?? 2525);
const dir = process.env.MAIL_DIR ?? path.resolve(process.cwd(), ".data/mail");
mkdirSync(dir, { recursive: true });

const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ["STARTTLS"],
  size: 10 * 1024 * 1024, // 10 MB per message
  onData(stream, session, callback) {
    simpleParser(stream)
      .then((mail) => {
        const id = `${Date.now()}-${randomUUID()}`;
        const record = {
          id,
          receivedAt: new Date().toISOString(),
          from: mail.from?.text ?? "",
          to: session.envelope.rcptTo.map((r) => r.address.toLowerCase()),
          subject: mail.subject ?? "",
          text: mail.text ?? "",
          html: typeof mail.html === "string" ? mail.html : "",
        };
        // write then rename so readers never see a half-written message
        const tmp = path.join(dir, `.${id}.tmp`);
        writeFileSync(tmp, JSON.stringify(record, null, 2));
        renameSync(tmp, path.join(dir, `${id}.json`));
        callback();
      })
      .catch((err) => callback(err));
  },
});

server.listen(port, "127.0.0.1", () => console.log(`fake mail server on 127.0.0.1:${port}, storing in ${dir}`));
const stop = () => server.close(() => process.exit(0));
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
