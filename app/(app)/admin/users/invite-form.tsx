"use client";

import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { InputField, SelectField } from "@/components/forms/field";
import { FormAlert } from "@/components/forms/form-alert";
import { applyServerErrors } from "@/components/forms/server-errors";
import { SubmitButton } from "@/components/forms/submit-button";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { inviteUserAction } from "./actions";
import { ROLE_OPTIONS, inviteSchema, type InviteInput } from "./schema";

const roleOptions = ROLE_OPTIONS.map((r) => ({ value: r, label: ROLE_LABELS[r] }));

export function InviteForm() {
  const [result, setResult] = useState<{ tone: "error" | "success"; text: string } | null>(null);
  const {
    register,
    handleSubmit,
    setError,
    reset,
    formState: { errors, isSubmitting },
  } = useForm<InviteInput, unknown, z.output<typeof inviteSchema>>({ resolver: zodResolver(inviteSchema), defaultValues: { email: "", role: "engineer" } });

  const onSubmit = handleSubmit(async (values) => {
    setResult(null);
    const res = await inviteUserAction(values).catch(() => null);
    if (!res) return setResult({ tone: "error", text: "The server could not be reached. Try again." });
    if (!res.ok) {
      const text = applyServerErrors(setError, res.error, ["email", "role"]);
      if (text) setResult({ tone: "error", text });
      return;
    }
    reset({ email: "", role: values.role });
    const until = `${res.data.expiresAt.slice(0, 16).replace("T", " ")} UTC`;
    setResult({ tone: "success", text: `Invitation sent to ${res.data.email}. The link works once, until ${until}.` });
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <div className="grid gap-4 sm:grid-cols-[1fr_14rem_auto] sm:items-start">
        <InputField label="E-mail" type="email" autoComplete="off" placeholder="name@company.example" error={errors.email?.message} {...register("email")} />
        <SelectField label="Role" options={roleOptions} error={errors.role?.message} {...register("role")} />
        <div className="sm:pt-6">
          <SubmitButton pending={isSubmitting} pendingLabel="Sending…">
            Send invitation
          </SubmitButton>
        </div>
      </div>
      {result ? <FormAlert tone={result.tone}>{result.text}</FormAlert> : null}
    </form>
  );
}
