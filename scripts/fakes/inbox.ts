/**
 * The local e-mail inbox for development, the demo and tests: an SMTP server (smtp-server) that keeps
 * every message it receives as a .eml file, and a small JSON API to read them back (mailparser).
 */
import { mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { createServer, type Server } from "node:http";
import path from "node:path";
import { simpleParser } from "mailparser";
import { SMTPServer } from "smtp-server";

export interface InboxMessage {
  id: string;
  from: string;
  to: string[];
  subject: string;
  date: string;
  text: string;
  attachments: { filename: string; contentType: string; size: number }[];
}

const MAX_MESSAGE_BYTES = 25 * 1024 * 1024;

async function parse(dir: string, file: string): Promise<InboxMessage> {
  const mail = await simpleParser(readFileSync(path.join(dir, file)));
  const to = Array.isArray(mail.to) ? mail.to.flatMap((a) => a.value) : (mail.to?.value ?? []);
  return {
    id: file.replace(/\.eml$/, ""),
    from: mail.from?.text ?? "",
    to: to.map((a) => a.address ?? "").filter(Boolean),
    subject: mail.subject ?? "",
    date: (mail.date ?? new Date()).toISOString(),
    text: mail.text ?? "",
    attachments: mail.attachments.map((a) => ({ filename: a.filename ?? "", contentType: a.contentType, size: a.size })),
  };
}

export function startInbox(opts: { smtpPort: number; httpPort: number; dir: string }): { smtp: SMTPServer; http: Server } {
  mkdirSync(opts.dir, { recursive: true });
  let seq = 0;

  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    size: MAX_MESSAGE_BYTES,
    banner: "Rootbank local inbox",
    onData(stream, _session, callback) {
      const chunks: Buffer[] = [];
      stream.on("data", (c: Buffer) => chunks.push(c));
      stream.on("end", () => {
        const id = `${Date.now().toString().padStart(15, "0")}-${String(seq++).padStart(4, "0")}`;
        writeFileSync(path.join(opts.dir, `${id}.eml`), Buffer.concat(chunks));
        callback();
      });
    },
  });
  smtp.listen(opts.smtpPort, "127.0.0.1");

  const http = createServer((req, res) => {
    const send = (status: number, body: unknown) => {
      res.writeHead(status, { "Content-Type": "application/json" });
      res.end(JSON.stringify(body));
    };
    const url = new URL(req.url ?? "/", "http://localhost");
    const files = () => readdirSync(opts.dir).filter((f) => f.endsWith(".eml")).sort().reverse();
    if (req.method === "GET" && url.pathname === "/messages") {
      const to = url.searchParams.get("to")?.toLowerCase();
      Promise.all(files().map((f) => parse(opts.dir, f)))
        .then((all) => send(200, to ? all.filter((m) => m.to.some((a) => a.toLowerCase() === to)) : all))
        .catch((err: unknown) => send(500, { error: String(err) }));
    } else if (req.method === "DELETE" && url.pathname === "/messages") {
      for (const f of files()) rmSync(path.join(opts.dir, f));
      send(200, { deleted: true });
    } else {
      send(404, { error: "not found" });
    }
  });
  http.listen(opts.httpPort, "127.0.0.1");
  return { smtp, http };
}
