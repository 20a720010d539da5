import { defineAsyncComponent } from 'vue'

/**
 * naive-ui's theme and message providers, around the parts of a page built from the component
 * library. They load apart from the first bundle, so a page of plain markup (the Lake read) does
 * not wait for the library before it draws; the router starts loading them for every other page.
 */
export const loadNaiveScope = () => import('./NaiveScope.vue')
export const NaiveScope = defineAsyncComponent(loadNaiveScope)
