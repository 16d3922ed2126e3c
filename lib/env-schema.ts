import { z } from 'zod';
import { parseTrustedProxies } from './client-address';

/** Booleans from the environment: only these spellings count, anything else is an error. */
const envBool = z
  .enum(['1', '0', 'true', 'false', 'yes', 'no', 'on', 'off', ''])
  .transform((v) => ['1', 'true', 'yes', 'on'].includes(v));

export const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  DATABASE_URL: z.string().regex(/^postgres(ql)?:\/\//, 'must be a postgresql:// URL'),
  AUTH_SECRET: z.string().min(32, 'must be at least 32 characters'),
  APP_URL: z.string().url().default('http://127.0.0.1:3000'),
  SECURE_COOKIES: envBool.optional(),
  SMTP_HOST: z.string().default('127.0.0.1'),
  SMTP_PORT: z.coerce.number().int().positive().default(1025),
  MAIL_FROM: z.string().default('Notchwise <no-reply@notchwise.test>'),
  STRIPE_SECRET_KEY: z.string().default('sk_test_local_fake'),
  /** Required in production (no fallback: anyone could sign events with a public one). */
  STRIPE_WEBHOOK_SECRET: z.string().min(1).optional(),
  /** host:port of the local Stripe stand-in; unset to talk to Stripe itself. */
  STRIPE_FAKE_URL: z.string().url().optional(),
  RUN_WORKER: envBool.default(true),
  /** bcrypt cost; 12 in production, lower only in tests. */
  BCRYPT_COST: z.coerce.number().int().min(4).max(15).default(12),
  /** Respondent starts per minute from one IP address (a venue's or a panel's NAT shares one). */
  RATE_LIMIT_RESPONDENT_PER_MIN: z.coerce.number().int().positive().default(6000),
  /** New respondents per link from one address per 10 minutes (a start holds a seat that long; see respondent/server/respondents.ts). */
  RATE_LIMIT_STARTS_PER_LINK_ADDRESS: z.coerce.number().int().positive().default(10),
  /** Respondent answers (and state/complete calls) per minute from one IP address. */
  RATE_LIMIT_ANSWERS_PER_MIN: z.coerce.number().int().positive().default(120_000),
  /** Answers per minute of one respondent (a person answers about one a second). */
  RATE_LIMIT_ANSWERS_PER_RESPONDENT_PER_MIN: z.coerce.number().int().positive().default(600),
  /** Which X-Forwarded-For hop is the client: unset = none (the socket), a hop count, or our proxies' CIDRs (README, several instances). */
  TRUSTED_PROXIES: z.string().default('').superRefine((v, ctx) => {
    try {
      parseTrustedProxies(v);
    } catch (err) {
      ctx.addIssue({ code: 'custom', message: (err as Error).message });
    }
  }),
});

/** The development and test fallback for the webhook secret; public, so refused in production. */
export const DEV_WEBHOOK_SECRET = 'whsec_local_fake_secret';

/** Rules across variables: production runs only with its own secrets. */
const checkedEnvSchema = envSchema
  .superRefine((e, ctx) => {
    if (e.NODE_ENV !== 'production') return;
    if (!e.STRIPE_WEBHOOK_SECRET) ctx.addIssue({ code: 'custom', path: ['STRIPE_WEBHOOK_SECRET'], message: 'required in production (the signing secret of your Stripe webhook endpoint, whsec_…)' });
    else if (e.STRIPE_WEBHOOK_SECRET === DEV_WEBHOOK_SECRET) ctx.addIssue({ code: 'custom', path: ['STRIPE_WEBHOOK_SECRET'], message: 'the public development value cannot be used in production' });
  })
  .transform((e) => ({ ...e, STRIPE_WEBHOOK_SECRET: e.STRIPE_WEBHOOK_SECRET ?? DEV_WEBHOOK_SECRET }));

export type Env = z.infer<typeof checkedEnvSchema>;

/** Parses an environment; throws one readable error listing every bad variable. */
export function parseEnv(source: Record<string, string | undefined>): Env {
  const cleaned = Object.fromEntries(Object.entries(source).filter(([, v]) => v !== undefined));
  const result = checkedEnvSchema.safeParse(cleaned);
  if (!result.success) {
    const lines = result.error.issues.map((i) => `  ${i.path.join('.') || '(env)'}: ${i.message}`);
    throw new Error(`Invalid environment:\n${lines.join('\n')}`);
  }
  return result.data;
}
