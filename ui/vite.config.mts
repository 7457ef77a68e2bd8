/**
 * Builds the screens into ui/dist for both hosts (the desktop window's app:// pages and the
 * browser host). Both serve the pages under a strict Content Security Policy (script-src
 * 'self'; style-src 'self'), so nothing may be inlined: scripts and every component's styles
 * go to files, and no asset becomes a data: URL inside a script.
 *
 * This is build tooling run by Node, kept beside the screens it builds; it is a `.mts` file
 * because the layering check reads the screens' `.ts`, `.js` and `.svelte` files, which may
 * not import Node or vite.
 */
import { fileURLToPath } from 'node:url';
import { svelte } from '@sveltejs/vite-plugin-svelte';
import { defineConfig } from 'vite';

const UI_ROOT = fileURLToPath(new URL('.', import.meta.url));

export default defineConfig({
  root: UI_ROOT,
  base: './',
  publicDir: false,
  clearScreen: false,
  plugins: [svelte({ configFile: false, emitCss: true, compilerOptions: { css: 'external' } })],
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    assetsInlineLimit: 0,
    cssCodeSplit: false,
    modulePreload: { polyfill: false },
    target: 'es2022',
    sourcemap: false,
  },
});
