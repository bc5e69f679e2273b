/**
 * The wheel-axis conventions (toe and camber to a spin axis and back) belong to the design
 * format and live in core/design/wheelAxis.ts; re-exported here for the mechanism templates
 * and the analysis modules.
 */
export { camberFromAxis, toeFromHeading, wheelHeading, wheelSpinAxisAtDesign } from '../design/wheelAxis';
