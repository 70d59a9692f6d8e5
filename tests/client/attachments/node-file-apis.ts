/**
 * jsdom brings its own Blob, File and FormData, which neither Node's fetch nor Dexie understand here: Dexie notes the
 * global Blob class when it loads and clones any other as a plain object, and fetch wants Node's FormData. A browser
 * has one coherent set, so the test takes Node's. Import this module first, before anything that loads Dexie.
 */
import { Blob as NodeBlob, File as NodeFile } from 'node:buffer'
import { vi } from 'vitest'

const NodeFormData = (await new Response(new URLSearchParams('a=1')).formData()).constructor
vi.stubGlobal('Blob', NodeBlob)
vi.stubGlobal('File', NodeFile)
vi.stubGlobal('FormData', NodeFormData)
