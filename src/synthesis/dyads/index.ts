/**
 * Dyads: binary links (two-pin links) between the die body and a plate, or between two plates, synthesised for
 * finitely separated positions by Burmester theory (Erdman, Sandor & Kota, *Mechanism Design*; Sandor & Erdman,
 * *Advanced Mechanism Design* vol. 2; McCarthy & Soh, *Geometric Design of Linkages*). The only door of this folder.
 */
export { type RelativePose, placePoint, localPoint, invertPoses } from './relative-pose.js';
export { type Dyad, dyadDistances, dyadResidual, measureDyad } from './measure-dyad.js';
export { type KasaCircle, kasaCircleFit } from './kasa-circle-fit.js';
export { type DisplacementPole, displacementPole, displacementPoles } from './displacement-poles.js';
export { type CentrePoint3, centrePointFor3 } from './centre-point-for-3.js';
export { type CirclePointSolve, circlePointForCentre } from './circle-point-for-centre.js';
export {
  type CentrePointCurve,
  type CentrePointCurveOptions,
  type CurveSample,
  centrePointCurve4,
  resolveCentrePointCurveOptions,
} from './centre-point-curve-4.js';
export {
  type BurmesterOptions,
  type BurmesterPoints,
  burmesterPoints5,
  resolveBurmesterOptions,
} from './burmester-points-5.js';
export {
  type DyadFit,
  type DyadFitOptions,
  type DyadFitStart,
  fitDyadLeastSquares,
  resolveDyadFitOptions,
} from './fit-dyad-least-squares.js';
export {
  type MultistartDyads,
  type MultistartOptions,
  multistartDyads,
  resolveMultistartOptions,
} from './multistart-dyads.js';
export { type SliderFit, invertedSliderDyad, sliderDyad } from './slider-dyad.js';
