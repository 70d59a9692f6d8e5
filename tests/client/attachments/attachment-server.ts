import { rmSync } from 'node:fs'
import type { AddressInfo } from 'node:net'
import express from 'express'
import { configureApiBase } from '@/api/client'
import { makeTestApp } from '../../server/helpers.ts'
import { allowPhotos, makeDataDir } from '../../server/attachments/photos.ts'

/** A photo file as a phone's file input hands it over. */
export function photoFile(bytes: Buffer, name = 'set-up.jpg', type = 'image/jpeg'): File {
  return new File([new Uint8Array(bytes)], name, { type })
}

/** Faults met by photo uploads before they reach the real API, and a count of those that arrived. */
export interface UploadFaults {
  /** How many uploads answer 503 before one gets through. */
  failures: number
  arrived: number
}

/** The real API on in-memory SQLite with photos allowed, on a loopback port, with the client's `api` pointed at it. */
export async function startAttachmentServer() {
  const data = makeDataDir()
  const { app, sequelize } = await makeTestApp({ attachmentsDir: data.dir })
  await allowPhotos(true)
  const uploads: UploadFaults = { failures: 0, arrived: 0 }
  const push = { failures: 0 }
  const front = express()
  front.post('/api/exams/:id/attachments', (req, res, next) => {
    uploads.arrived += 1
    if (uploads.failures <= 0) return next()
    uploads.failures -= 1
    req.resume()
    res.status(503).json({ error: { code: 'unavailable', message: 'The server is busy' } })
  })
  front.post('/api/sync/push', (req, res, next) => {
    if (push.failures <= 0) return next()
    push.failures -= 1
    req.resume()
    res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on the server' } })
  })
  front.use(app)
  const server = front.listen(0, '127.0.0.1')
  await new Promise<void>((resolve) => server.once('listening', () => resolve()))
  configureApiBase(`http://127.0.0.1:${(server.address() as AddressInfo).port}/api/`, { timeout: 10_000 })
  const close = async () => {
    server.closeAllConnections()
    await new Promise((resolve) => server.close(resolve))
    await sequelize.close()
    rmSync(data.root, { recursive: true, force: true })
  }
  return { app, uploads, push, data, close }
}
