export function log(msg: string): void;
export function fail(msg: string, hint?: string): never;
export function run(cmd: string, args: string[], opts?: Record<string, unknown>): { code: number; stdout: string; stderr: string; error?: Error };
export function runLive(cmd: string, args: string[], opts?: Record<string, unknown>): Promise<number>;
export function isRoot(): boolean;
