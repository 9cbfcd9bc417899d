// Loads the test database settings for integration tests; engine and unit tests need nothing.
import { loadTestEnv } from "./support/test-env";

loadTestEnv();
