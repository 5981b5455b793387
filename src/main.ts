import { createApp } from 'vue';
import { createPinia } from 'pinia';
import '@fontsource/work-sans/400.css';
import '@fontsource/work-sans/500.css';
import '@fontsource/work-sans/600.css';
import '@fontsource/work-sans/700.css';
// Element Plus base variables first so the theme overrides them whatever chunk loads later;
// components get their styles from the on-demand resolver, but functions called from
// script (ElMessage, ElMessageBox) and the v-loading directive do not, hence these imports.
import 'element-plus/theme-chalk/base.css';
import 'element-plus/es/components/message/style/css';
import 'element-plus/es/components/message-box/style/css';
import 'element-plus/es/components/loading/style/css';
import '@/styles/theme.css';
import App from './App.vue';
import { setUpDatePickers } from './format/date-pickers';
import { createAppRouter } from './router';

setUpDatePickers();

const app = createApp(App);
app.use(createPinia());
const router = createAppRouter();
app.use(router);

// Mounting after the first navigation avoids flashing the shell before the session is known.
void router.isReady().then(() => app.mount('#app'));
