import type { Metadata } from "next";
import { redirect } from "next/navigation";
import { FormAlert } from "@/components/forms/form-alert";
import { currentActor } from "@/lib/auth/guard";
import { LoginForm } from "./login-form";

export const metadata: Metadata = { title: "Sign in" };

const NOTICES: Record<string, string> = {
  joined: "Your account is ready. Sign in with your e-mail and the password you chose.",
  "signed-out": "You are signed out.",
};

type Search = Promise<Record<string, string | string[] | undefined>>;

export default async function LoginPage({ searchParams }: { searchParams: Search }) {
  const params = await searchParams;
  const first = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v);
  const callbackUrl = first(params.callbackUrl) ?? "/projects";
  // Someone already signed in (and still active) goes straight on.
  const actor = await currentActor().catch(() => null);
  if (actor) redirect("/projects");
  const notice = NOTICES[first(params.notice) ?? ""];

  return (
    <div className="panel p-6 sm:p-8">
      <h1 className="text-xl font-semibold text-fen-950">Sign in</h1>
      <p className="mt-1 text-sm text-fen-600">Use the e-mail address your administrator invited.</p>
      {notice ? (
        <div className="mt-4">
          <FormAlert tone="success">{notice}</FormAlert>
        </div>
      ) : null}
      <LoginForm callbackUrl={callbackUrl} defaultEmail={first(params.email) ?? ""} />
    </div>
  );
}
