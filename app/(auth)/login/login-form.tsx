"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { signIn } from "next-auth/react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { z } from "zod";
import { InputField } from "@/components/forms/field";
import { FormAlert } from "@/components/forms/form-alert";
import { SubmitButton } from "@/components/forms/submit-button";

const schema = z.object({
  email: z.string().trim().min(1, "E-mail is required").max(254, "E-mail must be at most 254 characters").pipe(z.email("E-mail must be an address like name@company.example")),
  password: z.string().min(1, "Password is required").max(200, "Password must be at most 200 characters"),
});
type Values = z.input<typeof schema>;

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
  const {
    register,
    handleSubmit,
    formState: { errors, isSubmitting },
  } = useForm<Values, unknown, z.output<typeof schema>>({ resolver: zodResolver(schema), defaultValues: { email: defaultEmail, password: "" } });

  const onSubmit = handleSubmit(async ({ email, password }) => {
    setFormError(null);
    let res: Awaited<ReturnType<typeof signIn>>;
    try {
      res = await signIn("credentials", { email, password, redirect: false });
    } catch {
      setFormError("The server could not be reached. Check your connection and try again.");
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
  });

  return (
    <form onSubmit={onSubmit} noValidate className="mt-6 space-y-4">
      {formError ? <FormAlert>{formError}</FormAlert> : null}
      <InputField label="E-mail" type="email" autoComplete="username" autoFocus={!defaultEmail} error={errors.email?.message} {...register("email")} />
      <InputField label="Password" type="password" autoComplete="current-password" autoFocus={Boolean(defaultEmail)} error={errors.password?.message} {...register("password")} />
      <SubmitButton pending={isSubmitting} pendingLabel="Signing in…" className="w-full">
        Sign in
      </SubmitButton>
    </form>
  );
}
