"use client";

import { ErrorPanel } from "@/components/ui/error-panel";
import { useRetry } from "@/components/ui/use-retry";

export default function RootError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  const retry = useRetry(reset);
  return (
    <main id="main" className="min-h-screen">
      <ErrorPanel digest={error.digest} onRetry={retry} />
    </main>
  );
}
