import { loadEnvFile } from "../../scripts/load-env";

/**
 * Integration tests run against `<DB_NAME>_test` on the project-local MariaDB
 * (scripts/test.sh starts it and migrates that database first).
 */
export function loadTestEnv() {
  loadEnvFile();
  process.env.DB_NAME = `${(process.env.DB_NAME ?? "ohmstead").replace(/_test$/, "")}_test`;
  delete process.env.DATABASE_URL;
  process.env.OUTBOX_SENDER = "off";
  process.env.NEXTAUTH_SECRET ??= "test-secret-test-secret-test-secret";
}
