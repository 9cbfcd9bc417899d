// A local stand-in for an SMTP server: accepts every message on 127.0.0.1 and stores it
// as a JSON file in FAKE_MAILBOX_DIR (default .data/mailbox), where the admin mailbox page
// reads it. Usage: npx tsx scripts/fake-smtp.ts [--port 2525]
import path from "node:path";
import { loadEnvFile } from "./load-env";
import { close, createFakeSmtpServer, listen } from "../lib/mail/fake-smtp-server";
import { storeMessage } from "../lib/mail/fake-mailbox";

loadEnvFile();

function portFromArgs(): number {
  const i = process.argv.indexOf("--port");
  const raw = i >= 0 ? process.argv[i + 1] : process.env.SMTP_PORT;
  const port = Number(raw ?? 2525);
  if (!Number.isInteger(port) || port < 1 || port > 65535) {
    console.error(`fake-smtp: port must be a whole number from 1 to 65535 (got "${raw}")`);
    process.exit(2);
  }
  return port;
}

const port = portFromArgs();
const dir = path.resolve(process.env.FAKE_MAILBOX_DIR || ".data/mailbox");

const server = createFakeSmtpServer(async (raw, envelope) => {
  const m = await storeMessage(dir, raw, envelope);
  console.log(`fake-smtp: ${m.receivedAt} to=${envelope.to.join(",")} subject="${m.subject}" -> ${m.id}.json`);
});

let stopping = false;
async function stop(signal: string) {
  if (stopping) return;
  stopping = true;
  console.log(`fake-smtp: ${signal}, closing`);
  // Open client connections are not waited for beyond 3 s.
  setTimeout(() => process.exit(0), 3000).unref();
  await close(server);
  process.exit(0);
}
process.on("SIGTERM", () => void stop("SIGTERM"));
process.on("SIGINT", () => void stop("SIGINT"));

try {
  await listen(server, port);
} catch (err) {
  console.error(`fake-smtp: cannot listen on 127.0.0.1:${port}: ${err instanceof Error ? err.message : err}`);
  process.exit(1);
}
console.log(`fake-smtp: listening on 127.0.0.1:${port}, storing messages in ${path.relative(process.cwd(), dir) || "."}`);
