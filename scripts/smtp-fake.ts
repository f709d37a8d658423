// A local SMTP fake for the demo, development and tests: accepts every message on 127.0.0.1 and keeps it
// as a raw .eml file in --dir, where the mail page (app/(app)/mail) lists it. Never relays anything.
import { SMTPServer } from "smtp-server";
import fs from "node:fs";
import path from "node:path";

function arg(name: string, fallback: string): string {
  const i = process.argv.indexOf(`--${name}`);
  return i >= 0 && process.argv[i + 1] ? process.argv[i + 1] : fallback;
}

const port = Number(arg("port", "2525"));
const dir = path.resolve(arg("dir", ".data/mail"));
fs.mkdirSync(dir, { recursive: true });
let seq = 0;

const server = new SMTPServer({
  authOptional: true,
  disabledCommands: ["STARTTLS"],
  size: 5 * 1024 * 1024,
  onData(stream, session, callback) {
    const chunks: Buffer[] = [];
    stream.on("data", (c: Buffer) => chunks.push(c));
    stream.on("end", () => {
      const name = `${Date.now()}-${process.pid}-${String(seq++).padStart(5, "0")}.eml`;
      const envelope = `X-Kitwright-Envelope-To: ${session.envelope.rcptTo.map((r) => r.address).join(", ")}\r\n`;
      const tmp = path.join(dir, `.${name}.tmp`);
      fs.writeFileSync(tmp, Buffer.concat([Buffer.from(envelope), ...chunks]));
      fs.renameSync(tmp, path.join(dir, name));
      callback();
    });
  },
});

server.listen(port, "127.0.0.1", () => {
  process.stdout.write(`SMTP fake listening on 127.0.0.1:${port}, keeping mail in ${dir}\n`);
});
const stop = () => server.close(() => process.exit(0));
process.on("SIGTERM", stop);
process.on("SIGINT", stop);
