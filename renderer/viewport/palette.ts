/**
 * The viewport's own colours for what carries no status: parts by class, the selection, the
 * turn paths, the ground and its marks. Status colours stay severity.ts's. Parts are low in
 * chroma and apart in lightness and hue family, so the status colours stand out on them; the
 * selection and the paths have a second channel besides colour (the selection a halo of three
 * rings and a larger ball, the paths dashed), as every status has its glyph and mark shape.
 */
export const VIEW_COLOUR = {
  frame: '#4a525c',
  wishbone: '#9ea7b0',
  upright: '#6f6455',
  steering: '#a4713a',
  tieRod: '#c29a5b',
  spring: '#7a8a4e',
  axis: '#8c4f86',
  joint: '#262b31',
  tyre: '#2e3237',
  rim: '#b9c0c6',
  /** The selected hardpoint: a saturated blue-violet, with its halo. */
  selection: '#3b3bdb',
  /** Turn paths (dashed) and the turn centre. */
  path: '#2c6e4a',
  pathRadius: '#9fc3ae',
  background: '#eef0ec',
  ground: '#dfe2dc',
  gridMinor: '#d0d4cd',
  gridMajor: '#b5bbb2',
  groundMark: '#5d6670',
  shadow: '#1b1f24',
  /** The lean angle in the front view. */
  lean: '#b1452c',
  vertical: '#7d868f',
} as const;
