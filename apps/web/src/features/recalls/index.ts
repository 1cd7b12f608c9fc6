// What other features may use from the recalls feature.
export { ProbingDepthChart } from './components/probing-depth-chart';
// The exam form offers measured bone levels: a feature that changes them invalidates its context.
export { recallKeys } from './api/keys';
