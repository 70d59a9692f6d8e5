import { createHash, randomUUID } from 'node:crypto'
import { mkdirSync, mkdtempSync } from 'node:fs'
import { readFile, unlink, writeFile } from 'node:fs/promises'
import os from 'node:os'
import path from 'node:path'
import { fileTypeFromBuffer } from 'file-type'
import sharp from 'sharp'
import { ATTACHMENT_MIME_TYPES, type AttachmentMime } from '#shared/schemas/attachment'
import { AppError } from '../errors.ts'

const EXTENSIONS: Record<AttachmentMime, string> = { 'image/jpeg': 'jpg', 'image/png': 'png', 'image/webp': 'webp' }
// A decompression bomb stops here: 50 megapixels covers a 48 MP phone camera.
const MAX_PIXELS = 50_000_000
const STORED_NAME = /^[0-9a-f-]{36}\.(jpg|png|webp)$/

/** The folder photos are written to, outside the web root; made on first use. */
export interface AttachmentStore {
  readonly dir: string
}

/** `dir` comes from the config (DATA_DIR/attachments); without one (API tests of other features) a fresh temp folder. */
export function attachmentStore(dir?: string): AttachmentStore {
  let resolved: string | undefined
  return {
    get dir() {
      if (!resolved) {
        resolved = dir ? path.resolve(dir) : mkdtempSync(path.join(os.tmpdir(), 'plumbline-attachments-'))
        mkdirSync(resolved, { recursive: true, mode: 0o700 })
      }
      return resolved
    },
  }
}

const isAllowed = (mime: string): mime is AttachmentMime => (ATTACHMENT_MIME_TYPES as readonly string[]).includes(mime)

/** The image type read from the bytes themselves; anything but JPEG, PNG or WebP answers 415. */
export async function sniffImageType(bytes: Buffer): Promise<AttachmentMime> {
  // A view made here: file-type checks `instanceof Uint8Array`, which a Buffer from another realm (a test runner) fails.
  const found = await fileTypeFromBuffer(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.length))
  if (found && isAllowed(found.mime)) return found.mime
  throw new AppError('unsupported-type', 415, 'Only JPEG, PNG or WebP photos can be attached', {
    file: found ? `This file is ${found.mime}, not a JPEG, PNG or WebP photo` : 'This file is not a JPEG, PNG or WebP photo',
  })
}

export interface CleanImage {
  bytes: Buffer
  width: number
  height: number
}

/**
 * Re-encodes the photo in its own format with the orientation applied to the pixels. sharp writes no EXIF (GPS
 * position, camera, times), XMP, IPTC or ICC comments unless told to keep them, so none survives.
 */
export async function stripMetadata(bytes: Buffer, mime: AttachmentMime): Promise<CleanImage> {
  try {
    const image = sharp(bytes, { limitInputPixels: MAX_PIXELS, failOn: 'error' }).rotate()
    const encoded =
      mime === 'image/jpeg' ? image.jpeg({ quality: 90, mozjpeg: true }) : mime === 'image/png' ? image.png() : image.webp({ quality: 90 })
    const { data, info } = await encoded.toBuffer({ resolveWithObject: true })
    return { bytes: data, width: info.width, height: info.height }
  } catch {
    throw new AppError('unreadable-image', 400, 'The photo could not be read', {
      file: 'The photo is damaged or too large (at most 50 megapixels)',
    })
  }
}

export const sha256Of = (bytes: Buffer) => createHash('sha256').update(bytes).digest('hex')

function pathOf(store: AttachmentStore, storedName: string): string {
  // Defence in depth: only names this module made are ever joined to the folder.
  if (!STORED_NAME.test(storedName)) throw new Error('Not a stored attachment name')
  return path.join(store.dir, storedName)
}

/** Writes the bytes under a new random name (never the sender's) and answers that name. */
export async function writeStored(store: AttachmentStore, bytes: Buffer, mime: AttachmentMime): Promise<string> {
  const storedName = `${randomUUID()}.${EXTENSIONS[mime]}`
  await writeFile(pathOf(store, storedName), bytes, { flag: 'wx', mode: 0o600 })
  return storedName
}

export function readStored(store: AttachmentStore, storedName: string): Promise<Buffer> {
  return readFile(pathOf(store, storedName))
}

export async function removeStored(store: AttachmentStore, storedName: string): Promise<void> {
  await unlink(pathOf(store, storedName)).catch((e: NodeJS.ErrnoException) => {
    if (e.code !== 'ENOENT') throw e
  })
}

/** The sender's file name cut to a harmless label for display: no folders, no quotes, the extension of the real type. */
export function displayNameOf(original: string | undefined, mime: AttachmentMime): string {
  const base = (original ?? '').split(/[/\\]/).pop() ?? ''
  const stem = base
    .replace(/\.[^.]*$/, '')
    .replace(/[^A-Za-z0-9 _-]+/g, '-')
    .replace(/^[-\s]+|[-\s]+$/g, '')
    .slice(0, 80)
  return `${stem || 'photo'}.${EXTENSIONS[mime]}`
}
