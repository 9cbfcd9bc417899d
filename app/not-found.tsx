import Link from "next/link";
import { OhmsteadMark } from "@/components/shell/wordmark";

export default function NotFound() {
  return (
    <main id="main" className="mx-auto my-16 max-w-xl px-4">
      <div className="panel overflow-hidden">
        <div className="h-1 bg-fen-400" />
        <div className="p-6">
          <div className="mb-4 flex items-center gap-3">
            <OhmsteadMark className="h-8 w-8" />
            <h1 className="text-lg font-semibold text-fen-950">Not found</h1>
          </div>
          <p className="text-sm text-fen-700">
            There is nothing at this address that you can open. It may have been moved, or it belongs to a part of Ohmstead your role does not include.
          </p>
          <div className="mt-6">
            <Link href="/projects" className="btn-primary">
              Go to projects
            </Link>
          </div>
        </div>
      </div>
    </main>
  );
}
