import { Sequelize } from 'sequelize'

/** Opens SQLite through Sequelize: `storage` is a file path or ':memory:'. */
export function openDatabase(storage: string): Sequelize {
  return new Sequelize({ dialect: 'sqlite', storage, logging: false })
}
