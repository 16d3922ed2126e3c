export function ensureCluster(opts: { root: string; port: number; database: string }): Promise<string>;
export function stopCluster(opts: { root: string; mode?: 'smart' | 'fast' | 'immediate' }): boolean;
export function restartCluster(opts: { root: string }): boolean;
export function dropDatabase(opts: { port: number; database: string }): boolean;
export function createDatabase(opts: { port: number; database: string }): boolean;
