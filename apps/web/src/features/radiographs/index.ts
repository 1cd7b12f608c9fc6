// What other features may use from radiographs: the Site file's thumbnails of one site.
export { SiteRadiographs } from './components/site-radiographs';
export { useRadiographs } from './api/radiographs-api';
