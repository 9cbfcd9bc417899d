import { z } from "zod";
import { tokenCreateBody } from "@/app/api/v1/tokens/body";

/** The token form and its server actions share these schemas. */
export const createTokenSchema = tokenCreateBody;
export type CreateTokenInput = z.input<typeof createTokenSchema>;

export const revokeTokenSchema = z.object({
  tokenId: z.coerce.number({ error: "Token id must be a whole number from 1" }).int("Token id must be a whole number from 1").min(1, "Token id must be a whole number from 1"),
});
