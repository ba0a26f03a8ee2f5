/** Client entry: fonts, global styles, Pinia, the router, and last-resort error display. */
import '@fontsource/open-sans/400.css';
import '@fontsource/open-sans/600.css';
import '@fontsource/open-sans/700.css';
import 'ant-design-vue/dist/reset.css';
import './styles.css';

import { createApp } from 'vue';
import { createPinia } from 'pinia';
import { message } from 'ant-design-vue';
import App from './App.vue';
import { createAppRouter } from './router';
import { describeError } from './api/http';

const app = createApp(App);
const router = createAppRouter();

// Nothing may end as a blank screen: uncaught errors become a readable message.
app.config.errorHandler = (error) => {
  console.error(error);
  void message.error(describeError(error));
};
window.addEventListener('unhandledrejection', (event) => {
  void message.error(describeError(event.reason));
});
router.onError((error) => {
  console.error(error);
  void message.error(
    /dynamically imported module|Failed to fetch|Importing a module script failed/i.test(String(error))
      ? 'Could not load this screen (the application may have been updated). Please reload the page.'
      : describeError(error),
  );
});

message.config({ top: '72px', duration: 4, maxCount: 3 });

app.use(createPinia());
app.use(router);
app.mount('#app');
