import { Wordmark } from "@/components/shell/wordmark";

/** Signed-out pages: a single centred card under the wordmark. */
export default function AuthLayout({ children }: { children: React.ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col items-center bg-fen-50 px-4 py-12 sm:py-20">
      <div className="mb-8">
        <Wordmark tone="dark" />
      </div>
      <main id="main" className="w-full max-w-md">
        {children}
      </main>
      <p className="mt-10 max-w-md text-center text-xs text-fen-500">
        Ohmstead results are design aids. Verification against the governing standard and local codes, by a qualified engineer, decides.
      </p>
    </div>
  );
}
