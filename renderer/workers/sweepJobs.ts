/** The sweeps behind the charts and the map, run by the sweep worker: core's, shared with the report (core/report/chartSweeps.ts). */
export { computeCurves, computeMap, LINE_STEP_DEG, symmetricAxis, type CurveRequest, type MapRequest, type Progress } from '../../core/report/chartSweeps';
