import type { ChildProcess } from 'node:child_process';
export const TEST_PGPORT: number;
export const TEST_APP_PORT: number;
export const TEST_SMTP_PORT: number;
export const TEST_MAIL_WEB_PORT: number;
export function prepareTestDatabase(opts?: { fresh?: boolean }): Promise<string>;
export function testEnv(databaseUrl: string): Record<string, string>;
export function buildTestApp(env: Record<string, string>): void;
export function startTestApp(env: Record<string, string>): Promise<ChildProcess[]>;
