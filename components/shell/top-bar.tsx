import Link from "next/link";
import type { Actor } from "@/lib/auth/guard";
import { can, ROLE_LABELS } from "@/lib/auth/roles";
import { env } from "@/lib/env";
import { MainNav, type NavItem } from "./nav";
import { UserMenu } from "./user-menu";
import { Wordmark } from "./wordmark";

/** Links to the features this user may use; nothing else. */
export function navItemsFor(actor: Pick<Actor, "role">, fakeSmtp: boolean): NavItem[] {
  const items: NavItem[] = [];
  if (can(actor.role, "project.read")) items.push({ href: "/projects", label: "Projects" });
  if (can(actor.role, "sheet.write")) items.push({ href: "/my-sheets", label: "My sheets" });
  if (can(actor.role, "sheet.review")) items.push({ href: "/review", label: "Review queue" });
  if (can(actor.role, "ampacity.read")) items.push({ href: "/ampacity-tables", label: "Ampacity tables" });
  if (can(actor.role, "users.manage")) items.push({ href: "/admin/users", label: "Users" });
  if (can(actor.role, "organisation.manage")) items.push({ href: "/admin/organisation", label: "Organisation" });
  if (fakeSmtp && can(actor.role, "mailbox.read")) items.push({ href: "/admin/mailbox", label: "Mailbox" });
  return items;
}

export function TopBar({ actor, organisationName }: { actor: Actor; organisationName: string }) {
  return (
    <header className="sticky top-0 z-20 border-b border-fen-950 bg-fen-900 shadow-sm">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:rounded focus:bg-white focus:px-3 focus:py-1 focus:text-sm">
        Skip to content
      </a>
      <div className="mx-auto flex h-14 max-w-7xl items-center gap-4 px-4 sm:gap-6 sm:px-6">
        <Link href="/projects" aria-label="Ohmstead, go to projects" className="shrink-0">
          <Wordmark />
        </Link>
        <span aria-hidden="true" className="hidden h-6 w-px bg-fen-700 sm:block" />
        <div className="min-w-0 flex-1 overflow-x-auto">
          <MainNav items={navItemsFor(actor, env().FAKE_SMTP)} />
        </div>
        <UserMenu name={actor.name} email={actor.email} roleLabel={ROLE_LABELS[actor.role]} organisationName={organisationName} />
      </div>
      <div aria-hidden="true" className="h-0.5 bg-gradient-to-r from-copper-700 via-copper-400 to-fen-700" />
    </header>
  );
}
