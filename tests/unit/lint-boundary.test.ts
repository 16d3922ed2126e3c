import path from 'node:path';
import { ESLint } from 'eslint';
import { beforeAll, describe, expect, it } from 'vitest';

// Protects the data-layer boundary: routes, pages, shared components and the respondent's
// client code may not import the database module, the ORM or an entity (eslint.config.mjs,
// no-restricted-imports). Linted through ESLint's own API with the project's config, so a
// change that silently drops or narrows the rule fails here.

const ROOT = path.resolve(import.meta.dirname, '../..');
const eslint = new ESLint({ cwd: ROOT });

async function restricted(filePath: string, code: string): Promise<string[]> {
  const [result] = await eslint.lintText(code, { filePath: path.join(ROOT, filePath) });
  return result.messages.filter((m) => m.ruleId === 'no-restricted-imports').map((m) => m.message);
}

const useIt = (name: string) => `\nexport const used = ${name};\n`;

describe('no-restricted-imports keeps the database behind lib/server', () => {
  // Loading the Next.js and TypeScript configs takes a few seconds on a busy machine.
  beforeAll(() => eslint.calculateConfigForFile(path.join(ROOT, 'app/page.tsx')), 60_000);

  it('a page importing the database module is refused, with the way out in the message', async () => {
    const msgs = await restricted('app/(app)/w/[workspace]/probe/page.tsx', `import { em } from '@/lib/server/db/orm';${useIt('em')}`);
    expect(msgs).toHaveLength(1);
    expect(msgs[0]).toMatch(/database module is for lib\/server only/);
    expect(msgs[0]).toMatch(/data-access function/);
  });

  it('a route handler importing sql(), an entity or the ORM is refused, each one', async () => {
    const code = [
      "import { sql } from '@/lib/server/db/sql';",
      "import { Study } from '@/entities/study';",
      "import { wrap } from '@mikro-orm/core';",
      'export const used = [sql, Study, wrap];',
    ].join('\n');
    expect(await restricted('app/api/w/[workspace]/probe/route.ts', code)).toHaveLength(3);
  });

  it('a relative path to the database module is refused too', async () => {
    expect(await restricted('app/api/probe/route.ts', `import { em } from '../../../lib/server/db/orm';${useIt('em')}`)).toHaveLength(1);
  });

  it('shared components and the respondent client are covered, type-only imports included', async () => {
    expect(await restricted('components/probe.tsx', `import type { IStudy } from '@/entities/study';\nexport type Used = IStudy;\n`)).toHaveLength(1);
    expect(await restricted('respondent/client/probe.ts', `import { MikroORM } from '@mikro-orm/postgresql';${useIt('MikroORM')}`)).toHaveLength(1);
  });

  it('the respondent client imports no message catalogue (a phone gets only its study\'s, in the boot data), but may use the format helpers', async () => {
    const all = await restricted('respondent/client/probe.ts', `import { CATALOGUES } from '@/respondent/messages/all';${useIt('CATALOGUES')}`);
    expect(all).toHaveLength(1);
    expect(all[0]).toMatch(/holds no catalogue/);
    expect(await restricted('respondent/client/probe.ts', `import de from '@/respondent/messages/de';${useIt('de')}`)).toHaveLength(1);
    expect(await restricted('respondent/client/probe.ts', `import en from '../messages/en';${useIt('en')}`)).toHaveLength(1);
    expect(await restricted('respondent/client/probe.ts', `import { fill } from '@/respondent/messages/format';${useIt('fill')}`)).toEqual([]);
    // The data-layer rule still holds there too.
    expect(await restricted('respondent/client/probe.ts', `import { em } from '@/lib/server/db/orm';${useIt('em')}`)).toHaveLength(1);
  });

  it('data-access modules may use the database, and app code may call them (the rule is not a blanket ban)', async () => {
    expect(await restricted('lib/server/studies/probe.ts', `import { em } from '@/lib/server/db/orm';${useIt('em')}`)).toEqual([]);
    expect(await restricted('app/(app)/w/[workspace]/probe/page.tsx', `import { getStudy } from '@/lib/server/studies/studies';${useIt('getStudy')}`)).toEqual([]);
  });
});
