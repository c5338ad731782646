// Renderer entry: mount the editor.
import { mount } from 'svelte';
import App from './App.svelte';
import './app.css';

const target = document.getElementById('app');
if (!target) throw new Error('Yardwire: #app element missing from index.html');
mount(App, { target });
