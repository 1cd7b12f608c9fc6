// The Timeline feature's public surface, used by the Site file.
export { Timeline } from './components/timeline';
