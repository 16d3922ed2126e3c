export const ROOT: string;
export const DATA: string;
export const RESPONDENT_BUILD_ARGS: string[];
export function intFromEnv(name: string, fallback: number): number;
export function persistentSecret(name: string): string;
export const DEMO_PASSWORD: string;
export const DEMO_ACCOUNTS: { email: string; role: 'owner' | 'analyst' | 'viewer'; name: string }[];
