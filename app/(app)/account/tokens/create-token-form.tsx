"use client";

import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { InputField } from "@/components/forms/field";
import { FormAlert } from "@/components/forms/form-alert";
import { applyServerErrors } from "@/components/forms/server-errors";
import { SubmitButton } from "@/components/forms/submit-button";
import { createTokenAction } from "./actions";
import { createTokenSchema, type CreateTokenInput } from "./schema";
import { NewTokenNotice } from "./new-token-notice";

export function CreateTokenForm() {
  const [failure, setFailure] = useState<string | null>(null);
  const [created, setCreated] = useState<{ name: string; token: string } | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<CreateTokenInput, unknown, z.output<typeof createTokenSchema>>({ resolver: zodResolver(createTokenSchema), defaultValues: { name: "" } });

  const onSubmit = handleSubmit(async (values) => {
    setFailure(null);
    setCreated(null);
    const res = await createTokenAction(values).catch(() => null);
    if (!res) return setFailure("The server could not be reached. Try again.");
    if (!res.ok) {
      const text = applyServerErrors(setError, res.error, ["name"]);
      if (text) setFailure(text);
      return;
    }
    reset({ name: "" });
    setCreated({ name: res.data.name, token: res.data.token });
  });

  return (
    <div className="space-y-4">
      <form onSubmit={onSubmit} noValidate className="grid gap-4 sm:grid-cols-[1fr_auto] sm:items-start">
        <InputField
          label="Token name"
          hint="Say where it will be used, e.g. “Build server” or “Weekly export script”."
          autoComplete="off"
          maxLength={80}
          error={errors.name?.message}
          {...register("name")}
        />
        <div className="sm:pt-6">
          <SubmitButton pending={isSubmitting} pendingLabel="Creating…">
            Create token
          </SubmitButton>
        </div>
      </form>
      {failure ? <FormAlert tone="error">{failure}</FormAlert> : null}
      {created ? <NewTokenNotice name={created.name} token={created.token} onDismiss={() => setCreated(null)} /> : null}
    </div>
  );
}
