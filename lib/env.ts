import "server-only";
import { z } from "zod";

/** Server environment, read and checked once. A missing secret fails here with a plain message. */
const schema = z.object({
  NODE_ENV: z.enum(["development", "production", "test"]).default("development"),
  DATABASE_URL: z.string().min(1, "DATABASE_URL is required (npm start sets up a local database)"),
  NEXTAUTH_SECRET: z.string().min(32, "NEXTAUTH_SECRET must be at least 32 characters (npm start writes one)"),
  NEXTAUTH_URL: z.string().url().default("http://localhost:3000"),
  SMTP_HOST: z.string().default("127.0.0.1"),
  SMTP_PORT: z.coerce.number().int().positive().default(2525),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  MAIL_FROM: z.string().default("Rootbank <no-reply@rootbank.local>"),
  LOCAL_INBOX_URL: z.string().url().optional(),
  MAP_TILE_URL: z.string().default("/tiles/{z}/{x}/{y}.png"),
  VAPID_PUBLIC_KEY: z.string().optional(),
  VAPID_PRIVATE_KEY: z.string().optional(),
  VAPID_SUBJECT: z.string().default("mailto:alerts@rootbank.local"),
  FORECAST_API_URL: z.string().url().optional(),
  UPLOAD_DIR: z.string().default(".data/uploads"),
});

export type Env = z.infer<typeof schema>;

let cached: Env | undefined;

export function env(): Env {
  if (!cached) {
    const parsed = schema.safeParse(process.env);
    if (!parsed.success) {
      const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`).join("\n");
      throw new Error(`Rootbank's environment is incomplete:\n${lines}`);
    }
    cached = parsed.data;
  }
  return cached;
}
