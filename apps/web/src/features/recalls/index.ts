// What other features may use from the recalls feature.
export { ProbingDepthChart } from './components/probing-depth-chart';
