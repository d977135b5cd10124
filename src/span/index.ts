export {
  type MovingSpan,
  type MovingSpanResult,
  type MovingSpanOptions,
  type SpanEnds,
  findMovingSpans,
} from './find-moving-spans.js';
