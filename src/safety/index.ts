export { processCautions } from './process-cautions.js';
