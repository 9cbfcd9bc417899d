import { SMTPServer } from "smtp-server";

export interface ReceivedEnvelope {
  from: string | null;
  to: string[];
}

/**
 * An SMTP server that accepts every message and hands the raw text to `onMessage`.
 * Used by scripts/fake-smtp.ts and by the outbox tests. STARTTLS is disabled: the
 * library's built-in certificate is expired, and the sender connects with ignoreTLS.
 */
export function createFakeSmtpServer(onMessage: (raw: string, envelope: ReceivedEnvelope) => Promise<void> | void): SMTPServer {
  return new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS"],
    logger: false,
    size: 10 * 1024 * 1024,
    onAuth(auth, _session, callback) {
      // Any credentials are accepted: this server is a local stand-in only.
      callback(null, { user: auth.username ?? "local" });
    },
    onData(stream, session, callback) {
      const chunks: Buffer[] = [];
      stream.on("data", (c: Buffer) => chunks.push(c));
      stream.on("error", (err: Error) => callback(err));
      stream.on("end", () => {
        if ((stream as { sizeExceeded?: boolean }).sizeExceeded) {
          callback(Object.assign(new Error("Message exceeds the 10 MB limit"), { responseCode: 552 }));
          return;
        }
        const mailFrom = session.envelope.mailFrom;
        const envelope: ReceivedEnvelope = {
          from: mailFrom ? mailFrom.address : null,
          to: session.envelope.rcptTo.map((r) => r.address),
        };
        Promise.resolve(onMessage(Buffer.concat(chunks).toString("utf8"), envelope)).then(
          () => callback(),
          (err: unknown) => callback(err instanceof Error ? err : new Error(String(err))),
        );
      });
    },
  });
}

/** Resolves once the server listens; port 0 picks a free port (read it back with `boundPort`). */
export function listen(server: SMTPServer, port: number, host = "127.0.0.1"): Promise<void> {
  return new Promise((resolve, reject) => {
    server.once("error", reject);
    server.listen(port, host, () => {
      server.off("error", reject);
      resolve();
    });
  });
}

export function boundPort(server: SMTPServer): number {
  const addr = (server as unknown as { server: { address(): { port: number } | string | null } }).server.address();
  if (!addr || typeof addr === "string") throw new Error("SMTP server is not listening on a TCP port");
  return addr.port;
}

export function close(server: SMTPServer): Promise<void> {
  return new Promise((resolve) => server.close(() => resolve()));
}
