import { z } from "zod";

/**
 * Request body of POST /api/v1/tokens and the form on the API tokens page; the same
 * rules as the token module's name schema (which decides on the server).
 */
export const tokenCreateBody = z.object({
  name: z
    .string({ error: "Token name is required (1 to 80 characters)" })
    .trim()
    .min(1, "Token name is required (1 to 80 characters)")
    .max(80, "Token name must be at most 80 characters"),
});
export type TokenCreateBody = z.input<typeof tokenCreateBody>;
