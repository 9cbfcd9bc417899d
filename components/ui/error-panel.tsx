"use client";

import { useEffect, useState } from "react";
import { OhmsteadMark } from "@/components/shell/wordmark";

export const DATABASE_DOWN_TITLE = "Ohmstead cannot reach its database";

type Diagnosis = "checking" | "database-down" | "other";

/**
 * What an error boundary shows. Server errors reach the browser without their message
 * (only a digest), so the cause is asked of /api/health instead: a database that does
 * not answer gets its own message, anything else a generic one. No stack trace either way.
 */
export function ErrorPanel({ digest, onRetry }: { digest?: string; onRetry: () => void }) {
  const [diagnosis, setDiagnosis] = useState<Diagnosis>("checking");

  useEffect(() => {
    let cancelled = false;
    fetch("/api/health", { cache: "no-store" })
      .then((r) => r.json() as Promise<{ database?: string }>)
      .then((h) => !cancelled && setDiagnosis(h.database === "down" ? "database-down" : "other"))
      .catch(() => !cancelled && setDiagnosis("other"));
    return () => {
      cancelled = true;
    };
  }, []);

  if (diagnosis === "database-down") {
    return <DatabaseDownMessage onRetry={onRetry} />;
  }
  if (diagnosis === "checking") {
    return (
      <MessageCard title="This page could not be shown" tone="fail" onRetry={onRetry}>
        <p aria-live="polite">Checking whether Ohmstead can reach its database…</p>
      </MessageCard>
    );
  }
  return (
    <MessageCard title="This page could not be shown" tone="fail" onRetry={onRetry}>
      <p>Something went wrong on our side and it was logged. Nothing you entered was saved by the failed request.</p>
      <p>Try again; if it keeps happening, tell your administrator{digest ? " and quote the reference below" : ""}.</p>
      {digest && (
        <p className="font-mono text-xs text-fen-500">
          Reference: <span className="select-all">{digest}</span>
        </p>
      )}
    </MessageCard>
  );
}

export function DatabaseDownMessage({ onRetry }: { onRetry?: () => void }) {
  return (
    <MessageCard title={DATABASE_DOWN_TITLE} tone="warning" onRetry={onRetry ?? (() => window.location.reload())}>
      <p>Ohmstead cannot reach its database just now, so nothing can be shown or saved. Your data is kept in the database and is not affected.</p>
      <p>Try again in a moment. If this persists, whoever runs Ohmstead should check that the database server is running (for a local install: <code className="rounded bg-fen-100 px-1 font-mono text-xs">npm run db:start</code>).</p>
    </MessageCard>
  );
}

function MessageCard({ title, tone, onRetry, children }: { title: string; tone: "fail" | "warning"; onRetry: () => void; children: React.ReactNode }) {
  return (
    <div role="alert" className="mx-auto my-12 max-w-xl px-4">
      <div className="panel overflow-hidden">
        <div className={`h-1 ${tone === "fail" ? "bg-signal-500" : "bg-amberline-500"}`} />
        <div className="p-6">
          <div className="mb-4 flex items-center gap-3">
            <OhmsteadMark className="h-8 w-8" />
            <h1 className="text-lg font-semibold text-fen-950">{title}</h1>
          </div>
          <div className="space-y-3 text-sm text-fen-700">{children}</div>
          <div className="mt-6 flex gap-2">
            <button type="button" className="btn-primary" onClick={onRetry}>
              Try again
            </button>
          </div>
        </div>
      </div>
    </div>
  );
}
