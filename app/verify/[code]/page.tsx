import type { Metadata } from "next";
import { OhmsteadMark } from "@/components/shell/wordmark";
import { verificationView } from "./data";

export const metadata: Metadata = { title: "Verify a stamp", robots: { index: false } };
export const dynamic = "force-dynamic";

const TONE = {
  "approved-current": { bar: "bg-verdigris-500", text: "text-verdigris-700" },
  superseded: { bar: "bg-amberline-500", text: "text-amberline-700" },
  unknown: { bar: "bg-signal-500", text: "text-signal-700" },
} as const;

/**
 * The one public page: anyone holding a printed sheet can check its approval stamp
 * without signing in. It names the organisation, the sheet tag and revision labels only.
 */
export default async function VerifyPage({ params }: { params: Promise<{ code: string }> }) {
  const { code } = await params;
  const view = await verificationView(decodeURIComponent(code));
  const tone = TONE[view.state];
  return (
    <main id="main" className="mx-auto my-16 max-w-xl px-4">
      <div className="panel overflow-hidden">
        <div className={`h-1.5 ${tone.bar}`} />
        <div className="p-6">
          <div className="mb-4 flex items-center gap-3">
            <OhmsteadMark className="h-8 w-8" />
            <p className="text-sm text-fen-600">Stamp verification</p>
          </div>
          <p className="font-mono text-sm text-fen-500">Code {code.toUpperCase().slice(0, 40)}</p>
          <h1 className={`mt-1 text-2xl font-semibold ${tone.text}`} data-state={view.state}>
            {view.headline}
          </h1>
          <ul className="mt-4 space-y-1 text-sm text-fen-800">
            {view.lines.map((l) => (
              <li key={l}>{l}</li>
            ))}
          </ul>
          <p className="mt-6 border-t border-fen-100 pt-4 text-xs text-fen-500">
            Calculation sheets are design aids. Verification under the governing standard and local codes, and the judgement of a qualified engineer, decide.
          </p>
        </div>
      </div>
    </main>
  );
}
