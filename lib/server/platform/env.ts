import 'server-only';
import { parseEnv, type Env } from '@/lib/env-schema';

let cached: Env | undefined;

/** The typed environment; the only place the app reads process.env. */
export function env(): Env {
  cached ??= parseEnv(process.env);
  return cached;
}
