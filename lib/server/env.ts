import "server-only";
// The environment, validated once. Nothing else in the app reads process.env.
import { z } from "zod";

const schema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  KW_DB_HOST: z.string().default("127.0.0.1"),
  KW_DB_PORT: z.coerce.number().int().default(33061),
  KW_DB_USER: z.string().default("kitwright"),
  KW_DB_PASSWORD: z.string().default("kitwright-local"),
  KW_DB_NAME: z.string().default("kitwright"),
  KW_REDIS_URL: z.string().default("redis://127.0.0.1:63791"),
  KW_STORAGE_DIR: z.string().default(".data/storage"),
  /** Set KW_S3_BUCKET to keep samples in an S3-compatible store instead of the local disk. */
  KW_S3_BUCKET: z.string().optional(),
  KW_S3_ENDPOINT: z.string().optional(),
  KW_S3_REGION: z.string().default("us-east-1"),
  KW_S3_ACCESS_KEY: z.string().optional(),
  KW_S3_SECRET_KEY: z.string().optional(),
  KW_UPLOAD_MAX_FILE_BYTES: z.coerce.number().int().positive().default(200 * 1024 * 1024),
  KW_UPLOAD_MAX_BATCH_BYTES: z.coerce.number().int().positive().default(4 * 1024 * 1024 * 1024),
  /** Worker threads that measure in parallel (0 = measure on the worker's main thread). Default: one per core. */
  KW_MEASURE_THREADS: z.coerce.number().int().min(0).optional(),
  KW_APP_URL: z.string().url().default("http://localhost:3000"),
  NEXTAUTH_SECRET: z.string().min(16).default("kitwright-development-secret-change-me"),
  SMTP_HOST: z.string().default("127.0.0.1"),
  SMTP_PORT: z.coerce.number().int().default(2525),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  SMTP_SECURE: z.enum(["0", "1"]).default("0"),
  MAIL_FROM: z.string().default("Kitwright <no-reply@kitwright.localhost>"),
  /** Set when the local SMTP fake is in use: the folder it keeps mail in. The mail page exists only then. */
  KW_MAIL_FAKE_DIR: z.string().optional(),
  /**
   * "1": the caught-mail page (/mail) exists in a production build too. Without it the page exists only in
   * development and tests (NODE_ENV not "production"); either way only while KW_MAIL_FAKE_DIR is set. Our
   * scripts set it for the local demo and test profiles (scripts/env.sh); never set it where real people sign up.
   */
  KW_MAIL_PAGE: z.enum(["0", "1"]).default("0"),
  /** The one account that may read every caught message on the mail page (the demo's owner; scripts/demo.sh). */
  KW_MAIL_PAGE_ALL_TO: z.string().trim().toLowerCase().email().optional(),
  /**
   * Proxies whose forwarding headers (X-Forwarded-For, X-Forwarded-Host) are believed: IP addresses and CIDR
   * ranges, comma-separated. Empty (the default): none, the socket's peer is the client.
   */
  KW_TRUSTED_PROXIES: z.string().default(""),
  /**
   * The request header that holds the socket's peer address. Set by the web server's guard
   * (scripts/serve-guard.cjs) in its own process, which writes that header on every request; never set by hand.
   */
  KW_PEER_HEADER: z.string().regex(/^x-[a-z0-9-]+$/).optional(),
});

export type Env = z.infer<typeof schema>;

let cached: Env | undefined;
export function env(): Env {
  if (!cached) cached = schema.parse(process.env);
  return cached;
}
