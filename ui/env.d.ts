// The screens run in a browser page: they need the DOM's types, and Svelte's ambient types
// for runes in `*.svelte.ts` files and for importing `.svelte` components from TypeScript.
/// <reference lib="dom" />
/// <reference lib="dom.iterable" />
/// <reference types="svelte" />

// Stylesheets imported for their side effect; vite emits them as files.
declare module '*.css';
