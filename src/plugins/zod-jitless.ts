import { config } from 'zod'

// The server's Content-Security-Policy forbids eval. Without `jitless`, every zod object schema probes
// `new Function` as it is built, and the browser reports the blocked probe as a policy violation on each page load.
// main.ts imports this module first, so it runs before any schema module is evaluated.
config({ jitless: true })
