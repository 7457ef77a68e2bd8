/** Starts the screens: finds the host first (so the token leaves the address bar), then mounts. */
import { mount } from 'svelte';
import App from './App.svelte';
import { connectBridge } from './bridge.ts';
import './styles/base.css';

connectBridge();

const target = document.getElementById('app');
if (target === null) throw new Error('index.html has no #app element');
mount(App, { target });
