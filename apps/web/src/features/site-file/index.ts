// What other features may use from the Site file: the keys of per-site data, to read and refresh it.
// Keep components (and their CSS) out of this file: features that only need a key import it, and
// the Site file renders other features' components, so more here would bloat their chunks and
// close import cycles.
export { siteKeys } from './api/keys';
