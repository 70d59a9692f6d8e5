import { afterAll } from 'vitest'
import { dropPostgresDatabases } from './postgres-databases.ts'

// server-pg: each file's databases go when it ends, so the cluster holds only the files running now.
afterAll(() => dropPostgresDatabases())
