import { z } from "zod";

/**
 * Password length rule; equal to PASSWORD_RULE in lib/auth/password.ts (a test checks it).
 * Repeated here because that module loads the native hasher, which must stay out of the browser bundle.
 */
export const PASSWORD_RULE = { min: 10, max: 200 } as const;

/** Accepting an invitation: the same schema checks the form in the browser and the action on the server. */
export const acceptSchema = z
  .object({
    token: z.string().min(1, "The invitation link is incomplete").max(200, "The invitation link is not valid"),
    name: z.string().trim().min(2, "Name must be 2 to 120 characters").max(120, "Name must be 2 to 120 characters"),
    password: z
      .string()
      .min(PASSWORD_RULE.min, `Password must be at least ${PASSWORD_RULE.min} characters`)
      .max(PASSWORD_RULE.max, `Password must be at most ${PASSWORD_RULE.max} characters`),
    confirm: z.string().min(1, "Repeat the password to confirm it"),
  })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords do not match" });

export type AcceptInput = z.input<typeof acceptSchema>;
