import '@fontsource/open-sans/latin-400.css'
import '@fontsource/open-sans/latin-600.css'
import './styles/main.css'
import './styles/print.css'
import { createApp } from 'vue'
import App from './App.vue'
import { registerPlugins } from './plugins/index.ts'
import { router } from './router/index.ts'

const app = createApp(App)
registerPlugins(app)
// Mounted once the first route is resolved (sign-in guard included), so the first frame drawn is
// the right one: the bare sign-in page or the signed-in frame, never the one then the other.
const mount = () => app.mount('#app')
router.isReady().then(mount, mount)
