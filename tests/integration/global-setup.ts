// Integration tests run against the real MariaDB of the test profile (scripts/test.sh or
// scripts/with-test-env.sh start it and migrate). Refuse to run against anything else.
export default function setup() {
  if (process.env.KW_PROFILE !== "test") {
    throw new Error("Integration tests need the test services: run them with `bash scripts/with-test-env.sh npx vitest run --project integration`.");
  }
}
