import type { Role } from "@/db/schema";

declare module "next-auth" {
  interface Session {
    user: { id: number; organisationId: number; role: Role; name?: string | null; email?: string | null };
  }
}

declare module "next-auth/jwt" {
  interface JWT {
    userId: number;
    organisationId: number;
    role: Role;
  }
}
