import './plugins/zod-jitless'
import './styles/links.css'
import { afterFirstPaint } from './plugins/first-paint'
import { nextTask } from './utils/tasks'

// The app's code starts in three tasks rather than one long one (a phone's main thread stays free for input between
// them): the framework, then the component library, then the app with its stores, schemas and router.
const { createApp } = await import('vue')
await nextTask()
await import('./plugins/vuetify')
await nextTask()
const [{ default: App }, { registerPlugins }] = await Promise.all([import('./App.vue'), import('./plugins')])

const app = createApp(App)
registerPlugins(app)
// Once the page's boot screen (app bar and standing caution, index.html) is on screen, and in a task of its own: the
// session check's requests leave in the microtasks after this script, and rendering the app first would hold them back.
afterFirstPaint(() => app.mount('#app'))
