const KEY = 'plumbline.server-is-demo'

/** Keeps the server's last answer on whether it runs on demo data, so an offline start still shows the ribbon. */
export function rememberDemo(demo: boolean): void {
  try {
    localStorage.setItem(KEY, demo ? 'yes' : 'no')
  } catch {
    // storage refused: the ribbon then shows only while the server answers
  }
}

/** The last answer this device got; false when it never got one. */
export function lastKnownDemo(): boolean {
  try {
    return localStorage.getItem(KEY) === 'yes'
  } catch {
    return false
  }
}
