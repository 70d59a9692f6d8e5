import { Router } from 'express'
import { z } from 'zod'
import { AppSettingsUpdateSchema } from '#shared/schemas/settings'
import { currentUser } from '../middleware/auth.ts'
import { settingsInForce } from './settings-estimate.ts'
import { settingsHistory, settingsVersion, updateSettings } from './settings.service.ts'

const VersionParamsSchema = z.object({ version: z.coerce.number('Give a version number').int().min(1) })

/**
 * For any signed-in user: the settings in force (thresholds, default model, photos) with the error term the server
 * estimates with, and any past version by number.
 */
export function settingsRouter(): Router {
  const router = Router()
  router.get('/', async (_req, res) => res.json(await settingsInForce()))
  router.get('/versions/:version', async (req, res) => res.json(await settingsVersion(VersionParamsSchema.parse(req.params).version)))
  return router
}

/** For admins (mounted behind the role guard): save a new version, read the recent history. */
export function adminSettingsRouter(): Router {
  const router = Router()
  router.put('/', async (req, res) => res.json(await updateSettings(currentUser(res), AppSettingsUpdateSchema.parse(req.body))))
  router.get('/history', async (_req, res) => res.json({ versions: await settingsHistory() }))
  return router
}
