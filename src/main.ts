import '@fontsource/open-sans/latin-400.css'
import '@fontsource/open-sans/latin-600.css'
import './styles/main.css'
import './styles/print.css'
import { createApp } from 'vue'
import App from './App.vue'
import { registerPlugins } from './plugins/index.ts'

const app = createApp(App)
registerPlugins(app)
app.mount('#app')
