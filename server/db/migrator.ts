import { Umzug, SequelizeStorage } from 'umzug'
import type { QueryInterface, Sequelize } from 'sequelize'
import * as foundation from './migrations/2026.12.02T06.00.00.foundation.ts'
import * as exams from './migrations/2026.12.02T10.00.00.exams.ts'
import * as supervision from './migrations/2026.12.04T09.00.00.supervision.ts'
import * as agreementPairs from './migrations/2026.12.05T09.00.00.agreement-pairs.ts'
import * as syncCursor from './migrations/2026.12.06T09.00.00.sync-cursor.ts'
import * as rounds from './migrations/2026.12.07T09.00.00.rounds.ts'
import * as accountLinks from './migrations/2026.12.07T10.00.00.account-links.ts'
import * as settings from './migrations/2026.12.07T11.00.00.settings.ts'
import * as attachments from './migrations/2026.12.07T12.00.00.attachments.ts'
import * as agreementPairsTable from './migrations/2026.12.08T09.00.00.agreement-pairs-table.ts'
import * as userRoles from './migrations/2026.12.08T10.00.00.user-roles.ts'
import * as venousContext from './migrations/2026.12.09T09.00.00.venous-context.ts'
import * as agreementPairBounds from './migrations/2026.12.10T09.30.00.agreement-pair-bounds.ts'
import * as agreementPairCoveringIndexes from './migrations/2026.12.11T08.00.00.agreement-pair-covering-indexes.ts'
import * as listIndexes from './migrations/2026.12.11T09.00.00.list-indexes.ts'
import * as auditChain from './migrations/2026.12.11T10.00.00.audit-chain.ts'
import * as mailOutbox from './migrations/2026.12.11T10.30.00.mail-outbox.ts'
import * as references from './migrations/2026.12.11T11.00.00.references.ts'
import * as rateLimitHits from './migrations/2026.12.12T10.00.00.rate-limit-hits.ts'
import * as signatureSupersedeColumns from './migrations/2026.12.12T12.00.00.signature-supersede-columns.ts'

interface MigrationModule {
  up(q: QueryInterface): Promise<void>
  down(q: QueryInterface): Promise<void>
}

// Listed in code, in order, so the migrations run the same under tsx, vitest and any bundler.
const migrations: [string, MigrationModule][] = [
  ['2026.12.02T06.00.00.foundation', foundation],
  ['2026.12.02T10.00.00.exams', exams],
  ['2026.12.04T09.00.00.supervision', supervision],
  ['2026.12.05T09.00.00.agreement-pairs', agreementPairs],
  ['2026.12.06T09.00.00.sync-cursor', syncCursor],
  ['2026.12.07T09.00.00.rounds', rounds],
  ['2026.12.07T10.00.00.account-links', accountLinks],
  ['2026.12.07T11.00.00.settings', settings],
  ['2026.12.07T12.00.00.attachments', attachments],
  ['2026.12.08T09.00.00.agreement-pairs-table', agreementPairsTable],
  ['2026.12.08T10.00.00.user-roles', userRoles],
  ['2026.12.09T09.00.00.venous-context', venousContext],
  ['2026.12.10T09.30.00.agreement-pair-bounds', agreementPairBounds],
  ['2026.12.11T08.00.00.agreement-pair-covering-indexes', agreementPairCoveringIndexes],
  ['2026.12.11T09.00.00.list-indexes', listIndexes],
  ['2026.12.11T10.00.00.audit-chain', auditChain],
  ['2026.12.11T10.30.00.mail-outbox', mailOutbox],
  ['2026.12.11T11.00.00.references', references],
  ['2026.12.12T10.00.00.rate-limit-hits', rateLimitHits],
  ['2026.12.12T12.00.00.signature-supersede-columns', signatureSupersedeColumns],
]

/** Every migration's name, oldest first. */
export const migrationNames: readonly string[] = migrations.map(([name]) => name)

export function createMigrator(sequelize: Sequelize) {
  return new Umzug<QueryInterface>({
    migrations: migrations.map(([name, m]) => ({
      name,
      up: ({ context }) => m.up(context),
      down: ({ context }) => m.down(context),
    })),
    context: sequelize.getQueryInterface(),
    storage: new SequelizeStorage({ sequelize }),
    logger: undefined,
  })
}
