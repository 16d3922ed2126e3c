import type { ChildProcess } from 'node:child_process';
export function startService(name: string, cmd: string, args: string[], opts?: { env?: NodeJS.ProcessEnv; quiet?: boolean }): ChildProcess;
export function bin(name: string): string;
export function stopAll(signal?: NodeJS.Signals): void;
export function waitForPort(port: number, opts?: { host?: string; timeoutMs?: number }): Promise<void>;
export function startMailCatcher(opts: { smtpPort: number; webPort: number; quiet?: boolean }): ChildProcess;
export function startFakeStripe(opts: { port: number; webhookUrl: string; webhookSecret: string; quiet?: boolean; delayMs?: number }): ChildProcess;
export function stopService(child: ChildProcess, signal?: NodeJS.Signals): void;
export function portInUse(port: number, host?: string): Promise<boolean>;
