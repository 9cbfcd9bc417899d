/**
 * Next.js start-up hook: runs once per server process. The mail outbox sender runs in
 * the Node.js runtime only (it needs TCP sockets and the database pool); the PDF worker
 * thread is started and warmed a few seconds later.
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
    // Warm the PDF worker a little after start, off the request path.
    setTimeout(() => {
      void import("./lib/pdf/worker-render")
        .then((m) => m.warmPdfWorker())
        .catch((err: unknown) => console.error("[ohmstead] PDF worker warm-up failed:", err instanceof Error ? err.message : err));
    }, 3000).unref();
  }
}
