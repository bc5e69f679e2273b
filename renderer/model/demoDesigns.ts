/**
 * The demo designs bundled with the workbench (the files in assets/designs, as text), and
 * starting points for "New".
 */
import heron from '../../assets/designs/heron-tilting-velomobile.tiltsheet?raw';
import finch from '../../assets/designs/finch-knuckle-steered-trike.tiltsheet?raw';
import linnet from '../../assets/designs/linnet-track-rod-trike.tiltsheet?raw';
import swift from '../../assets/designs/swift-parallelogram-trike.tiltsheet?raw';
import wren from '../../assets/designs/wren-rack-trike.tiltsheet?raw';
import plover from '../../assets/designs/plover-tilting-quad.tiltsheet?raw';
import pipit from '../../assets/designs/pipit-balance-beam-trike.tiltsheet?raw';

export interface DemoDesign {
  id: string;
  fileName: string;
  /** What "New" calls this starting point. */
  starter: string;
  text: string;
}

export const DEMO_DESIGNS: readonly DemoDesign[] = [
  { id: 'heron', fileName: 'heron-tilting-velomobile.tiltsheet', starter: 'Tilting, split wishbones, bell crank', text: heron },
  { id: 'swift', fileName: 'swift-parallelogram-trike.tiltsheet', starter: 'Tilting, centre-pivot parallelogram', text: swift },
  { id: 'wren', fileName: 'wren-rack-trike.tiltsheet', starter: 'Non-tilting, split wishbones, rack', text: wren },
  { id: 'linnet', fileName: 'linnet-track-rod-trike.tiltsheet', starter: 'Non-tilting, split wishbones, one-piece track rod', text: linnet },
  { id: 'finch', fileName: 'finch-knuckle-steered-trike.tiltsheet', starter: 'Tilting, centre-pivot parallelogram, handlebar on the upright', text: finch },
  { id: 'plover', fileName: 'plover-tilting-quad.tiltsheet', starter: 'Tilting quadricycle, leaning rear pair', text: plover },
  { id: 'pipit', fileName: 'pipit-balance-beam-trike.tiltsheet', starter: 'Tilting, split wishbones, balance-beam lean linkage', text: pipit },
];

/** The design the workbench opens on when nothing else is asked for. */
export const DEFAULT_DEMO = DEMO_DESIGNS[0];
