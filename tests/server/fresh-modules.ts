import { afterAll, vi } from 'vitest'
import { dropPostgresDatabases } from './postgres-databases.ts'

// The server project runs with `isolate: false`: one worker keeps the packages it has imported (Express, Sequelize,
// sharp…), which is most of a file's start-up. Our own modules are evaluated afresh for every file, as isolation
// would, so module-level state (caches, counters) never carries over from one file to the next.
vi.resetModules()

// server-pg: each file's databases go when it ends, so the cluster holds only the files running now.
afterAll(() => dropPostgresDatabases())
