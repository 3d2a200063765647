/** Saved versions are immutable: answered like a PUT (409, or 404 for a version that does not exist). */
export { default } from './index.put'
