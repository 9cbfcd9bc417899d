"use client";

import { ErrorPanel } from "@/components/ui/error-panel";
import { plexSans } from "./fonts";
import "./globals.css";

/** Replaces the root layout when it fails, so it brings its own html and body. */
export default function GlobalError({ error }: { error: Error & { digest?: string }; reset: () => void }) {
  return (
    <html lang="en" className={plexSans.variable}>
      <body className="min-h-screen font-sans">
        <main id="main">
          {/* The root layout itself failed: a full reload is the only sound retry. */}
          <ErrorPanel digest={error.digest} onRetry={() => window.location.reload()} />
        </main>
      </body>
    </html>
  );
}
