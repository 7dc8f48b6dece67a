import { fileURLToPath } from 'node:url';
import { ESLint } from 'eslint';
import { beforeAll, describe, expect, it } from 'vitest';

/**
 * The import direction is held by eslint.config.js, not by habit: each case lints a one-line
 * file placed (in name only) where the import would live, and asks which boundary errors come back.
 * The imported files are real ones, so the rule sees the path the import resolves to.
 */
const root = fileURLToPath(new URL('../..', import.meta.url));
const eslint = new ESLint({ cwd: root });
const RULE = 'import-x/no-restricted-paths';

async function boundaryErrors(filePath: string, source: string) {
  const [result] = await eslint.lintText(`${source}\nexport { probe };\n`, { filePath });
  return result.messages.filter((message) => message.ruleId === RULE).map((message) => message.message);
}

const refused: Array<[string, string, string]> = [
  ['a client route importing server code', 'client/app/routes/probe.tsx', "import { AppError as probe } from '../../../server/lib/errors';"],
  ['a feature importing server code', 'client/features/jobs/api/probe.ts', "import { AppError as probe } from '../../../../server/lib/errors';"],
  ['server code importing the client', 'server/lib/probe.ts', "import { cn as probe } from '../../client/lib/cn';"],
  ['shared importing the client', 'shared/probe.ts', "import { cn as probe } from '../client/lib/cn';"],
  ['shared importing the client by alias', 'shared/probe.ts', "import { cn as probe } from '@client/lib/cn';"],
  ['shared importing the server', 'shared/probe.ts', "import { AppError as probe } from '../server/lib/errors';"],
  [
    "a feature importing another feature's internal file",
    'client/features/bids/components/probe.tsx',
    "import { ConfirmEmailNotice as probe } from '@client/features/auth/components/confirm-email-notice';",
  ],
  [
    "a feature importing another feature's internal file by relative path",
    'client/features/bids/components/probe.tsx',
    "import { ConfirmEmailNotice as probe } from '../../auth/components/confirm-email-notice';",
  ],
  ["a route importing a feature's internal file", 'client/app/routes/probe.tsx', "import { useMe as probe } from '@client/features/auth/api/use-me';"],
];

const allowed: Array<[string, string, string]> = [
  ['a feature using another through its public file', 'client/features/bids/components/probe.tsx', "import { ConfirmEmailNotice as probe } from '@client/features/auth';"],
  ['a feature using its own files', 'client/features/auth/components/probe.tsx', "import { ConfirmEmailNotice as probe } from './confirm-email-notice';"],
  ['a route using a feature through its public file', 'client/app/routes/probe.tsx', "import { useMe as probe } from '@client/features/auth';"],
  ['the client using shared', 'client/app/routes/probe.tsx', "import { operations as probe } from '@shared/catalogue';"],
  ['the server using shared', 'server/lib/probe.ts', "import { operations as probe } from '../../shared/catalogue';"],
  ['a test importing server code', 'tests/unit/probe.test.ts', "import { AppError as probe } from '../../server/lib/errors';"],
  ['a test importing a feature internal', 'tests/unit/probe.test.ts', "import { useMe as probe } from '../../client/features/auth/api/use-me';"],
];

describe('import boundaries (eslint.config.js)', () => {
  // The first lint loads the config, the plugins and the tsconfig paths: seconds on a busy machine.
  beforeAll(() => boundaryErrors('client/app/routes/probe.tsx', "import { operations as probe } from '@shared/catalogue';"), 60_000);

  it.each(refused)('refuse %s', async (_case, filePath, source) => {
    expect(await boundaryErrors(filePath, source)).toHaveLength(1);
  });

  it.each(allowed)('allow %s', async (_case, filePath, source) => {
    expect(await boundaryErrors(filePath, source)).toEqual([]);
  });

  it('keep Node built-ins out of shared/, which the browser loads too', async () => {
    const [result] = await eslint.lintText("import { readFileSync as probe } from 'node:fs';\nexport { probe };\n", { filePath: 'shared/probe.ts' });
    expect(result.messages.map((message) => message.ruleId)).toContain('import-x/no-nodejs-modules');
  });
});
