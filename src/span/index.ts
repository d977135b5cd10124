export {
  type MovingSpan,
  type MovingSpanResult,
  type MovingSpanOptions,
  findMovingSpans,
} from './find-moving-spans.js';
