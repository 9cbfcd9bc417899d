/**
 * Next.js start-up hook: runs once per server process. The mail outbox sender runs in
 * the Node.js runtime only (it needs TCP sockets and the database pool).
 */
export async function register() {
  if (process.env.NEXT_RUNTIME === "nodejs") {
    const { startOutboxSender } = await import("./lib/mail/sender");
    try {
      startOutboxSender();
    } catch (err) {
      // Mail waits in the outbox; the app itself keeps running.
      console.error("[ohmstead] mail outbox sender not started:", err instanceof Error ? err.message : err);
    }
  }
}
