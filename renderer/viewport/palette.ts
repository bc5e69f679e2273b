/**
 * The viewport's own colours for what carries no status: parts by class, the selection, the
 * turn paths, the ground and its marks. Status colours stay severity.ts's (mid lightness), so
 * the neutral parts are dark (the springs and rims light) and low in chroma: a part that turns to a status
 * colour changes visibly under every simulated colour-vision deficiency
 * (test/renderer/viewportColours.test.ts states the CIEDE2000 differences kept). The selection
 * (light violet) and the paths (near-black navy, dashed) have a second channel besides colour (the
 * selection a halo of three rings and a larger ball, the paths dashed), as every status has
 * its glyph and mark shape.
 */
export const VIEW_COLOUR = {
  frame: '#3c3c3c',
  wishbone: '#3c3c50',
  upright: '#3c2828',
  steering: '#283c3c',
  tieRod: '#3c283c',
  spring: '#a8b58a',
  axis: '#2a1f3d',
  joint: '#262b31',
  tyre: '#2e3237',
  rim: '#b9c0c6',
  /** The selected hardpoint: light violet, with its halo. */
  selection: '#c864f0',
  /** Turn paths (dashed) and the turn centre. */
  path: '#101828',
  pathRadius: '#9fc3ae',
  background: '#eef0ec',
  ground: '#dfe2dc',
  gridMinor: '#d0d4cd',
  gridMajor: '#b5bbb2',
  groundMark: '#5d6670',
  shadow: '#1b1f24',
  /** The lean angle in the front view. */
  lean: '#1e2a5a',
  vertical: '#7d868f',
} as const;
