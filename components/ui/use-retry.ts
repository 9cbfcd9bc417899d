"use client";

import { useRouter } from "next/navigation";
import { startTransition } from "react";

/** An error boundary's retry: fetch the server part again, then re-render the segment. */
export function useRetry(reset: () => void) {
  const router = useRouter();
  return () =>
    startTransition(() => {
      router.refresh();
      reset();
    });
}
