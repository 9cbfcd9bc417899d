import { redirect } from "next/navigation";
import { getOrganisationName } from "@/db/queries/shell";
import { Footer } from "@/components/shell/footer";
import { TopBar } from "@/components/shell/top-bar";
import { Wordmark } from "@/components/shell/wordmark";
import { DatabaseDownMessage } from "@/components/ui/error-panel";
import { currentActor, type Actor } from "@/lib/auth/guard";
import { isDatabaseDown } from "@/lib/errors";

export const dynamic = "force-dynamic";

type ShellState = { kind: "ok"; actor: Actor; organisationName: string } | { kind: "signed-out" } | { kind: "database-down" };

async function loadShell(): Promise<ShellState> {
  try {
    const actor = await currentActor();
    if (!actor) return { kind: "signed-out" };
    return { kind: "ok", actor, organisationName: await getOrganisationName(actor.organisationId) };
  } catch (err) {
    if (isDatabaseDown(err)) return { kind: "database-down" };
    throw err;
  }
}

/** The signed-in shell: top bar, the page, and the caution footer. */
export default async function AppLayout({ children }: { children: React.ReactNode }) {
  const shell = await loadShell();
  if (shell.kind === "signed-out") redirect("/login");
  if (shell.kind === "database-down") {
    return (
      <div className="flex min-h-screen flex-col">
        <header className="border-b border-fen-950 bg-fen-900">
          <div className="mx-auto flex h-14 max-w-7xl items-center px-4 sm:px-6">
            <Wordmark />
          </div>
        </header>
        <main id="main" className="flex-1">
          <DatabaseDownMessage />
        </main>
        <Footer />
      </div>
    );
  }
  return (
    <div className="flex min-h-screen flex-col">
      <TopBar actor={shell.actor} organisationName={shell.organisationName} />
      <main id="main" className="mx-auto w-full max-w-7xl flex-1 px-4 py-8 sm:px-6">
        {children}
      </main>
      <Footer />
    </div>
  );
}
