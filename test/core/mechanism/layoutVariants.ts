/**
 * Every layout the template can build, from the bundled demos and the minimal fixture: each
 * front-end kind, each steering kind (a bell crank at a fixed ratio or by drag link, a rack,
 * a lever, a handlebar on one upright turning an idler crank through the tie rods, a one-piece
 * track rod driven by a drag link, a centre lever or a handlebar on one upright), with
 * and without a spring, one rear wheel or a pair. Variants are made with the workbench's own
 * starting blocks (what a user gets by switching the layout), so they are designs a user can
 * reach; the track-rod drives, which have no starting block yet, are built here from the
 * design's kingpin. Each is checked by the validator before use.
 */
import type { DesignFile, ResolvedDesign } from '../../../core/design/types';
import { validateDesign } from '../../../core/design/validateDesign';
import { resolveDesign } from '../../../core/design/resolveDesign';
import { starterCrankInput, starterFrontEnd, starterSpring, starterSteering } from '../../../renderer/model/designStarters';
import { clone, loadDemos } from '../reliability/demoDesigns';

export interface LayoutVariant {
  name: string;
  design: ResolvedDesign;
}

type Steer = 'bellCrank:ratio' | 'bellCrank:dragLink' | 'bellCrank:knuckle' | 'rack' | 'direct' | 'trackRod:dragLink' | 'trackRod:knuckle' | 'trackRod:centreLever';
const STEERS: readonly Steer[] = ['bellCrank:ratio', 'bellCrank:dragLink', 'rack', 'direct', 'trackRod:dragLink', 'trackRod:knuckle', 'trackRod:centreLever', 'bellCrank:knuckle'];

/**
 * A one-piece track rod on the design's steering arms. The drag link pulls an arm 80 mm ahead
 * of and 60 mm inboard of the right kingpin's middle from a vertical column on the centre line;
 * a handlebar on the left upright needs a kingpin. Both ends are the track rod's joints.
 */
export function withTrackRod(d: DesignFile, drive: 'dragLink' | 'knuckle' | 'centreLever'): DesignFile {
  const out = clone(d);
  const r = resolveDesign(out);
  const up = r.frontEnd.upper.outerJoint.right;
  const lo = r.frontEnd.lower.outerJoint.right;
  const m = { x: (up.x + lo.x) / 2, y: (up.y + lo.y) / 2, z: (up.z + lo.z) / 2 };
  out.steering =
    drive === 'dragLink'
      ? {
          kind: 'trackRod',
          drive: {
            kind: 'dragLink',
            upright: 'right',
            columnPivot: { x: m.x, y: 0, z: m.z + 100 },
            columnAxis: { x: 0, y: 0, z: 1 },
            columnArmJoint: { x: m.x + 80, y: 0, z: m.z },
            uprightArmJoint: { x: m.x + 80, y: m.y + 60, z: m.z },
          },
        }
      : drive === 'centreLever'
        ? { kind: 'trackRod', drive: centreLeverOver(r) }
        : { kind: 'trackRod', drive: { kind: 'knuckle', upright: 'left' } };
  if (drive === 'knuckle') out.upright.steeringAxis = 'kingpin';
  out.joints.tieRodInner = clone(out.joints.tieRodOuter);
  return out;
}

/** A lever on a vertical column 60 mm behind the rod's middle, its arm forward over it and 40 mm up, the short link down to the middle. */
function centreLeverOver(r: ReturnType<typeof resolveDesign>): Extract<DesignFile['steering'], { kind: 'trackRod' }>['drive'] {
  const a = r.upright.steeringArmJoint;
  const m = { x: (a.right.x + a.left.x) / 2, y: (a.right.y + a.left.y) / 2, z: (a.right.z + a.left.z) / 2 };
  return { kind: 'centreLever', pivot: { x: m.x - 60, y: m.y - 80, z: m.z + 40 }, axis: { x: 0, y: 0, z: 1 }, leverJoint: { x: m.x, y: m.y - 80, z: m.z + 40 }, trackRodJoint: m };
}

function withSteering(d: DesignFile, steer: Steer): DesignFile {
  if (steer.startsWith('trackRod:')) return withTrackRod(d, steer.slice('trackRod:'.length) as 'dragLink' | 'knuckle' | 'centreLever');
  const [kind, input] = steer.split(':') as [Exclude<DesignFile['steering']['kind'], 'trackRod'>, 'ratio' | 'dragLink' | 'knuckle' | undefined];
  const out = clone(d);
  out.steering = starterSteering(out, kind);
  if (input && out.steering.kind === 'bellCrank') out.steering.input = starterCrankInput(out, input) ?? out.steering.input;
  // A handlebar on an upright turns it about its kingpin.
  if (input === 'knuckle') out.upright.steeringAxis = 'kingpin';
  return out;
}

export function layoutVariants(): LayoutVariant[] {
  const out: LayoutVariant[] = [];
  for (const demo of loadDemos()) {
    for (const frontEnd of ['splitWishbones', 'centrePivot'] as const) {
      for (const steer of STEERS) {
        const base = clone(demo.design);
        base.frontEnd = starterFrontEnd(base, frontEnd);
        // As the design sheet does: a lean linkage (push links on split wishbones) goes with a switch to members.
        if (frontEnd === 'centrePivot') delete base.leanLinkage;
        const d = withSteering(base, steer);
        // Spring and rear pair toggled against the demo's own choice, on alternate steering kinds.
        const flip = STEERS.indexOf(steer) % 2 === 1;
        if (flip) {
          if (d.spring) delete d.spring;
          else d.spring = starterSpring(d);
          d.vehicle.rear = d.vehicle.rear.kind === 'single' ? { kind: 'pair', trackMm: 700 } : { kind: 'single' };
        }
        const checked = validateDesign(d);
        const name = `${demo.file} / ${frontEnd} / ${steer}${d.spring ? ' / spring' : ''} / rear ${d.vehicle.rear.kind}`;
        if (!checked.ok) throw new Error(`variant ${name} does not validate: ${checked.issues.map((i) => i.message).join('; ')}`);
        out.push({ name, design: resolveDesign(checked.design) });
      }
    }
  }
  return out;
}
