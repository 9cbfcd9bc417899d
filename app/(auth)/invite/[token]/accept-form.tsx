"use client";

import { useState } from "react";
import { useRouter } from "next/navigation";
import { signIn } from "next-auth/react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { InputField } from "@/components/forms/field";
import { FormAlert } from "@/components/forms/form-alert";
import { applyServerErrors } from "@/components/forms/server-errors";
import { SubmitButton } from "@/components/forms/submit-button";
import { acceptInviteAction } from "./actions";
import { PASSWORD_RULE, acceptSchema, type AcceptInput } from "./schema";

export function AcceptForm({ token, email }: { token: string; email: string }) {
  const router = useRouter();
  const [formError, setFormError] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors, isSubmitting },
  } = useForm<AcceptInput, unknown, z.output<typeof acceptSchema>>({
    resolver: zodResolver(acceptSchema),
    defaultValues: { token, name: "", password: "", confirm: "" },
  });

  const onSubmit = handleSubmit(async (values) => {
    setFormError(null);
    const res = await acceptInviteAction(values).catch(() => null);
    if (!res) {
      setFormError("The server could not be reached. Check your connection and try again.");
      return;
    }
    if (!res.ok) {
      setFormError(applyServerErrors(setError, res.error, ["name", "password", "confirm"]));
      return;
    }
    // Sign straight in with the new password; if that is refused, the sign-in page explains.
    const signedIn = await signIn("credentials", { email: res.data.email, password: values.password, redirect: false }).catch(() => null);
    if (signedIn?.ok && !signedIn.error) {
      router.replace("/projects");
      router.refresh();
    } else {
      router.replace(`/login?notice=joined&email=${encodeURIComponent(res.data.email)}`);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="mt-6 space-y-4">
      {formError ? <FormAlert>{formError}</FormAlert> : null}
      <input type="hidden" {...register("token")} />
      {/* Lets password managers store the new password under the right account. */}
      <input type="email" name="username" autoComplete="username" value={email} readOnly hidden />
      <InputField label="Your name" autoComplete="name" autoFocus error={errors.name?.message} {...register("name")} />
      <InputField
        label="Password"
        type="password"
        autoComplete="new-password"
        hint={`At least ${PASSWORD_RULE.min} characters. A few unrelated words make a strong one.`}
        error={errors.password?.message}
        {...register("password")}
      />
      <InputField label="Repeat password" type="password" autoComplete="new-password" error={errors.confirm?.message} {...register("confirm")} />
      <SubmitButton pending={isSubmitting} pendingLabel="Creating your account…" className="w-full">
        Create account and sign in
      </SubmitButton>
    </form>
  );
}
