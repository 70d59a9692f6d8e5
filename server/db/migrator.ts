import { Umzug, SequelizeStorage } from 'umzug'
import type { QueryInterface, Sequelize } from 'sequelize'
import * as foundation from './migrations/2026.12.02T06.00.00.foundation.ts'

interface MigrationModule {
  up(q: QueryInterface): Promise<void>
  down(q: QueryInterface): Promise<void>
}

// Listed in code, in order, so the migrations run the same under tsx, vitest and any bundler.
const migrations: [string, MigrationModule][] = [['2026.12.02T06.00.00.foundation', foundation]]

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
