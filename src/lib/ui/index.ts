// Public face of src/lib/ui: shared Svelte components and page-side helpers.
export { default as UpdateBanner } from './UpdateBanner.svelte';
export { updateWatch } from './update-watch.svelte';
