/**
 * Every layout the template can build, from the bundled demos and the minimal fixture: each
 * front-end kind, each steering kind (a bell crank at a fixed ratio or by drag link, a rack,
 * a lever), with and without a spring, one rear wheel or a pair. Variants are made with the
 * workbench's own starting blocks (what a user gets by switching the layout), so they are
 * designs a user can reach; each is checked by the validator before use.
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

type Steer = 'bellCrank:ratio' | 'bellCrank:dragLink' | 'rack' | 'direct';
const STEERS: readonly Steer[] = ['bellCrank:ratio', 'bellCrank:dragLink', 'rack', 'direct'];

function withSteering(d: DesignFile, steer: Steer): DesignFile {
  const [kind, input] = steer.split(':') as [DesignFile['steering']['kind'], 'ratio' | 'dragLink' | undefined];
  const out = clone(d);
  out.steering = starterSteering(out, kind);
  if (input && out.steering.kind === 'bellCrank') out.steering.input = starterCrankInput(out, input) ?? out.steering.input;
  return out;
}

export function layoutVariants(): LayoutVariant[] {
  const out: LayoutVariant[] = [];
  for (const demo of loadDemos()) {
    for (const frontEnd of ['splitWishbones', 'centrePivot'] as const) {
      for (const steer of STEERS) {
        const base = clone(demo.design);
        base.frontEnd = starterFrontEnd(base, frontEnd);
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
