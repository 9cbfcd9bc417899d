"use client";

import { useState } from "react";
import { InputField, SelectField } from "@/components/forms/field";
import { FormAlert } from "@/components/forms/form-alert";
import { SubmitButton } from "@/components/forms/submit-button";
import { useSchemaForm } from "@/components/forms/use-schema-form";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { inviteUserAction } from "./actions";
import { ROLE_OPTIONS } from "./role-options";
import type { z } from "zod";
import type { inviteSchema } from "./schema";

const roleOptions = ROLE_OPTIONS.map((r) => ({ value: r, label: ROLE_LABELS[r] }));
// The same schema as the server action, loaded when the form is first used.
const loadSchema = () => import("./schema").then((m) => m.inviteSchema);
const UNREACHABLE = "The server could not be reached. Try again.";

export function InviteForm() {
  const [result, setResult] = useState<{ tone: "error" | "success"; text: string } | null>(null);
  const { errors, pending, formProps, applyServerErrors } = useSchemaForm(loadSchema);

  const onValid = async (values: z.output<typeof inviteSchema>, form: HTMLFormElement) => {
    setResult(null);
    const res = await inviteUserAction(values).catch(() => null);
    if (!res) return setResult({ tone: "error", text: UNREACHABLE });
    if (!res.ok) {
      const text = applyServerErrors(res.error, ["email", "role"]);
      if (text) setResult({ tone: "error", text });
      return;
    }
    // Ready for the next invitation: the e-mail is cleared, the role is kept.
    const email = form.elements.namedItem("email");
    if (email instanceof HTMLInputElement) email.value = "";
    const until = `${res.data.expiresAt.slice(0, 16).replace("T", " ")} UTC`;
    setResult({ tone: "success", text: `Invitation sent to ${res.data.email}. The link works once, until ${until}.` });
  };

  return (
    <form {...formProps(onValid, () => setResult({ tone: "error", text: UNREACHABLE }))} className="space-y-4">
      <div className="grid gap-4 sm:grid-cols-[1fr_14rem_auto] sm:items-start">
        <InputField label="E-mail" name="email" type="email" autoComplete="off" placeholder="name@company.example" error={errors.email} />
        <SelectField label="Role" name="role" options={roleOptions} defaultValue="engineer" error={errors.role} />
        <div className="sm:pt-6">
          <SubmitButton pending={pending} pendingLabel="Sending…">
            Send invitation
          </SubmitButton>
        </div>
      </div>
      {result ? <FormAlert tone={result.tone}>{result.text}</FormAlert> : null}
    </form>
  );
}
