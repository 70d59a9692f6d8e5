import { afterEach, describe, expect, it, vi } from 'vitest'
import { loadIconFont } from '@/plugins/icon-font'

class FakeFontFace {
  static made: FakeFontFace[] = []
  loaded = false
  readonly family: string
  readonly source: string
  readonly descriptors: FontFaceDescriptors
  constructor(family: string, source: string, descriptors: FontFaceDescriptors) {
    this.family = family
    this.source = source
    this.descriptors = descriptors
    FakeFontFace.made.push(this)
  }
  load() {
    this.loaded = true
    return Promise.resolve(this)
  }
}

function documentWithFonts() {
  const added: unknown[] = []
  return { doc: { fonts: { add: (face: unknown) => added.push(face) } } as unknown as Document, added }
}

afterEach(() => {
  FakeFontFace.made = []
})

describe('loadIconFont', () => {
  it('adds the woff2 copy of the icon font under the family the icon classes name, hidden until loaded, and loads it', () => {
    vi.stubGlobal('FontFace', FakeFontFace)
    const { doc, added } = documentWithFonts()

    loadIconFont(doc)

    const [face] = FakeFontFace.made
    expect(added).toEqual([face])
    expect(face!.family).toBe('Material Design Icons')
    expect(face!.source).toMatch(/^url\(.*materialdesignicons-webfont.*\.woff2\) format\('woff2'\)$/)
    expect(face!.descriptors).toEqual({ display: 'block' })
    expect(face!.loaded).toBe(true)
  })

  it('in a browser without the FontFace API, does nothing and throws nothing', () => {
    vi.stubGlobal('FontFace', undefined)
    const { doc, added } = documentWithFonts()

    loadIconFont(doc)

    expect(added).toEqual([])
  })
})
