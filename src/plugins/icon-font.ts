import iconFontUrl from '@mdi/font/fonts/materialdesignicons-webfont.woff2?url'

/**
 * Loads the icon font (400 KB) once the first page is on screen, so it never shares the network with the scripts and
 * text of the first paint. The service worker precaches the same file, so icons show offline as well. `block`: an
 * icon is hidden until the font arrives rather than drawn as a box in another font.
 */
export function loadIconFont(doc: Document = document) {
  if (typeof FontFace !== 'function' || !doc.fonts) return
  const face = new FontFace('Material Design Icons', `url(${iconFontUrl}) format('woff2')`, { display: 'block' })
  doc.fonts.add(face)
  face.load().catch((error) => console.warn('The icon font did not load', error))
}
