import { all, withFile } from './sqlite-file.ts'
import { migrationNames } from './migrator.ts'

/** A database file that is not a whole Plumbline database this version can open. */
export class NotPlumblineDatabase extends Error {}

/**
 * Checks that the file is an undamaged SQLite database (`PRAGMA integrity_check`) holding Plumbline's migrations, in
 * order, each known to this version; answers the last one applied. An older database is fine: the server applies the
 * rest at start. One from a newer version is refused, as this version cannot know its schema.
 */
export async function checkPlumblineDatabase(file: string): Promise<{ migration: string }> {
  return withFile(file, async (db) => {
    const integrity = await all<{ integrity_check: string }>(db, 'PRAGMA integrity_check').catch(() => [])
    if (integrity[0]?.integrity_check !== 'ok') throw new NotPlumblineDatabase(`${file} is not an undamaged SQLite database`)
    const tables = await all<{ name: string }>(db, `SELECT name FROM sqlite_master WHERE type = 'table' AND name = 'SequelizeMeta'`)
    if (!tables.length) throw new NotPlumblineDatabase(`${file} holds no Plumbline migrations`)
    const applied = (await all<{ name: string }>(db, 'SELECT name FROM "SequelizeMeta" ORDER BY name')).map((r) => r.name)
    const unknown = applied.find((name, i) => name !== migrationNames[i])
    if (unknown) throw new NotPlumblineDatabase(`${file} has migration ${unknown}, which this version of Plumbline does not know`)
    if (!applied.length) throw new NotPlumblineDatabase(`${file} holds no Plumbline migrations`)
    return { migration: applied.at(-1)! }
  })
}
