// The Timeline feature's public surface, used by the Site file.
import './components/timeline.css';
export { Timeline } from './components/timeline';
