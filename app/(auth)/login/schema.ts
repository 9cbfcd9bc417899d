import { z } from "zod";

/**
 * What the sign-in form checks in the browser before asking the server. Loaded on demand
 * by the form (see useSchemaForm), so zod is not part of the page's first load.
 */
export const loginSchema = z.object({
  email: z.string().trim().min(1, "E-mail is required").max(254, "E-mail must be at most 254 characters").pipe(z.email("E-mail must be an address like name@company.example")),
  password: z.string().min(1, "Password is required").max(200, "Password must be at most 200 characters"),
});
