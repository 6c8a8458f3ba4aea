import { createApp } from 'vue';
import App from './App.vue';
import './styles.css';
import './charts/register.ts';

createApp(App).mount('#app');
