import { existsSync, mkdtempSync, readdirSync } from 'node:fs'
import os from 'node:os'
import path from 'node:path'
import sharp from 'sharp'
import request from 'supertest'
import { currentSettings, updateSettings } from '../../../server/settings/settings.service.ts'
import { getUser } from '../../../server/users/users.service.ts'
import { makeUser } from '../helpers.ts'

type App = Parameters<typeof request>[0]

/** A small plain image in the given format, made here rather than read from a fixture. */
export function makePhoto(format: 'jpeg' | 'png' | 'webp' | 'gif', width = 64, height = 48): Promise<Buffer> {
  return sharp({ create: { width, height, channels: 3, background: { r: 180, g: 120, b: 90 } } })
    .toFormat(format)
    .toBuffer()
}

/** A JPEG as a phone writes it: camera make, a GPS position (51°30′ N, 0°7′ W) and "rotate 90°" in its EXIF. */
export function makePhoneJpeg(): Promise<Buffer> {
  return sharp({ create: { width: 64, height: 48, channels: 3, background: { r: 90, g: 120, b: 180 } } })
    .jpeg()
    .withExif({
      IFD0: { Make: 'Saltmarsh Test Camera' },
      IFD3: { GPSLatitudeRef: 'N', GPSLatitude: '51/1 30/1 0/1', GPSLongitudeRef: 'W', GPSLongitude: '0/1 7/1 0/1' },
    })
    .withMetadata({ orientation: 6 })
    .toBuffer()
}

/**
 * The tag numbers of IFD0 in an EXIF block ("Exif\0\0" then a TIFF header), read by hand after the TIFF 6.0
 * specification (section 2: header, IFD entries of 12 bytes). 0x8825 is the pointer to the GPS IFD (EXIF 2.3, section 4.6.3).
 */
export function ifd0Tags(exif: Buffer): number[] {
  const tiff = exif.subarray(exif.subarray(0, 6).toString('latin1') === 'Exif\0\0' ? 6 : 0)
  const le = tiff.toString('latin1', 0, 2) === 'II'
  const u16 = (at: number) => (le ? tiff.readUInt16LE(at) : tiff.readUInt16BE(at))
  const u32 = (at: number) => (le ? tiff.readUInt32LE(at) : tiff.readUInt32BE(at))
  const ifd = u32(4)
  return Array.from({ length: u16(ifd) }, (_, i) => u16(ifd + 2 + i * 12))
}
export const GPS_IFD_POINTER = 0x8825

/** A data folder of its own: photos go to `<root>/attachments`, so anything written beside it shows. */
export function makeDataDir() {
  const root = mkdtempSync(path.join(os.tmpdir(), 'plumbline-attachments-test-'))
  const dir = path.join(root, 'attachments')
  return { root, dir, files: () => (existsSync(dir) ? readdirSync(dir).sort() : []) }
}

/** `POST /api/exams/:id/attachments` as the caller, with the consent ticked unless told otherwise. */
export function upload(
  app: App,
  auth: string,
  examId: string,
  file: Buffer,
  opts: { filename?: string; contentType?: string; consent?: string | null; id?: string } = {},
) {
  let req = request(app).post(`/api/exams/${examId}/attachments`).set('Authorization', auth)
  if (opts.consent !== null) req = req.field('consent', opts.consent ?? 'true')
  if (opts.id) req = req.field('id', opts.id)
  return req.attach('file', file, { filename: opts.filename ?? 'photo.jpg', contentType: opts.contentType ?? 'image/jpeg' })
}

/** Switches photos on or off as an admin would, through the settings service (photos are off by default). */
export async function allowPhotos(allowed: boolean): Promise<void> {
  const admin = await makeUser({ roles: ['admin'], withPassword: false })
  const current = await currentSettings()
  await updateSettings((await getUser(admin.id))!, { ...current.values, photosAllowed: allowed, baseVersion: current.version })
}
