"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { InputField } from "@/components/forms/field";
import { FormAlert } from "@/components/forms/form-alert";
import { SubmitButton } from "@/components/forms/submit-button";
import { useSchemaForm } from "@/components/forms/use-schema-form";

// Both loaded on demand (first focus, or the first submit): neither is needed to draw the form.
const loadSchema = () => import("./schema").then((m) => m.loginSchema);
const loadSignIn = () => import("next-auth/react").then((m) => m.signIn);

/** Only paths on this site: an absolute or protocol-relative URL elsewhere falls back to /projects. */
function safeDestination(raw: string): string {
  try {
    const url = new URL(raw, window.location.origin);
    if (url.origin !== window.location.origin || url.pathname.startsWith("/login") || url.pathname.startsWith("/api/")) return "/projects";
    return `${url.pathname}${url.search}${url.hash}`;
  } catch {
    return "/projects";
  }
}

export function LoginForm({ callbackUrl, defaultEmail }: { callbackUrl: string; defaultEmail: string }) {
  const router = useRouter();
  const [formError, setFormError] = useState<string | null>(null);
  const { errors, pending, formProps } = useSchemaForm(loadSchema, { preload: loadSignIn });
  const unreachable = () => setFormError("The server could not be reached. Check your connection and try again.");

  const onValid = async ({ email, password }: { email: string; password: string }) => {
    setFormError(null);
    let res;
    try {
      const signIn = await loadSignIn();
      res = await signIn("credentials", { email, password, redirect: false });
    } catch {
      unreachable();
      return;
    }
    if (!res || res.error || !res.ok) {
      const message = res?.error ?? "";
      if (message === "CredentialsSignin" || message === "") setFormError("E-mail or password is not right");
      // The throttle's message says when to try again; anything else stays generic.
      else if (message.startsWith("Too many failed sign-ins")) setFormError(message);
      else setFormError("Signing in is not possible right now. Try again in a moment.");
      return;
    }
    router.replace(safeDestination(callbackUrl));
    router.refresh();
  };

  return (
    <form {...formProps(onValid, unreachable)} className="mt-6 space-y-4">
      {formError ? <FormAlert>{formError}</FormAlert> : null}
      <InputField label="E-mail" name="email" type="email" autoComplete="username" autoFocus={!defaultEmail} defaultValue={defaultEmail} error={errors.email} />
      <InputField label="Password" name="password" type="password" autoComplete="current-password" autoFocus={Boolean(defaultEmail)} error={errors.password} />
      <SubmitButton pending={pending} pendingLabel="Signing in…" className="w-full">
        Sign in
      </SubmitButton>
    </form>
  );
}
