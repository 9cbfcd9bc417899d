"use client";

import { ErrorPanel } from "@/components/ui/error-panel";
import { useRetry } from "@/components/ui/use-retry";

export default function AppError({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  const retry = useRetry(reset);
  return <ErrorPanel digest={error.digest} onRetry={retry} />;
}
