// What other features may use from the catalogue feature: the catalogue itself (the planner
// chooses parts from it).
export { useCatalogue } from './api/catalogue-api';
export { useCantileverSettings } from './api/cantilever-settings';
