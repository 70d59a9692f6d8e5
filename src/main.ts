import './plugins/zod-jitless'
import './styles/links.css'
import { createApp } from 'vue'
import App from './App.vue'
import { registerPlugins } from './plugins'

const app = createApp(App)
registerPlugins(app)
// In a task of its own: the session check's requests leave in the microtasks after this script, and rendering the app
// bar first would hold them back.
setTimeout(() => app.mount('#app'))
