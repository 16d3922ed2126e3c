import { describe, expect, it } from 'vitest';
import { execFileSync } from 'node:child_process';
import pg from 'pg';

describe('migrations', () => {
  it('apply to an empty database and create every table', async () => {
    const base = new URL(process.env.DATABASE_URL!);
    const name = `notchwise_migr_${Date.now()}`;
    const admin = new pg.Client({ connectionString: base.toString().replace(/\/[^/]+$/, '/postgres') });
    await admin.connect();
    await admin.query(`create database ${name}`);
    try {
      const url = base.toString().replace(/\/[^/]+$/, `/${name}`);
      const out = execFileSync('npx', ['tsx', 'scripts/migrate.ts'], { env: { ...process.env, DATABASE_URL: url }, encoding: 'utf8' });
      expect(out).toMatch(/applied/);
      const c = new pg.Client({ connectionString: url });
      await c.connect();
      const { rows } = await c.query(`select table_name from information_schema.tables where table_schema = 'public'`);
      await c.end();
      const tables = rows.map((r: { table_name: string }) => r.table_name);
      for (const t of ['workspace', 'app_user', 'membership', 'audit_event', 'study', 'trial', 'seat_ledger_entry', 'mikro_orm_migrations']) {
        expect(tables).toContain(t);
      }
      // Running again is a no-op.
      expect(execFileSync('npx', ['tsx', 'scripts/migrate.ts'], { env: { ...process.env, DATABASE_URL: url }, encoding: 'utf8' })).toMatch(/up to date/);
    } finally {
      await admin.query(`drop database if exists ${name} with (force)`);
      await admin.end();
    }
  });
});
