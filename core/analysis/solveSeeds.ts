/**
 * Seeds: solved poses of one design kept to start the solves of a slightly moved copy of it.
 *
 * A study that moves a hardpoint by a small amount (a finite difference, an optimiser's step)
 * solves the moved design at the same poses as the design it came from. Solved afresh, each
 * pose is reached from the design pose by continuation, several sub-steps each. Started from
 * the original design's solution of the same pose (same inputs), the solver's first Newton step
 * is the implicit-function tangent of the change, dx = -C_x^-1 C(x, p + dp) ~ -C_x^-1 C_p dp,
 * and one or two more close the loops: the same answer (to the solver's tolerance) for a
 * fraction of the work, and on the same assembly branch.
 *
 * A book records, per solver role (the engine's main, side and upright solvers) and exact
 * inputs, the pose each solve reached; a later engine replays them, seeding each solve whose
 * role and inputs it holds. A seeded solve that fails falls back to the solver's own start.
 */

import { INPUT_NAMES, type PoseInputs } from '../mechanism/MechanismGraph';
import type { SolverSeed } from '../solver/PoseSolver';

export type SolverRole = 'main' | 'side' | 'upright';

export class SeedBook {
  private readonly seeds = new Map<string, SolverSeed>();

  private static key(role: SolverRole, inputs: PoseInputs): string {
    let k: string = role;
    for (const name of INPUT_NAMES) k += `|${inputs[name]}`;
    return k;
  }

  record(role: SolverRole, inputs: PoseInputs, seed: SolverSeed | null): void {
    if (seed) this.seeds.set(SeedBook.key(role, inputs), seed);
  }

  seedFor(role: SolverRole, inputs: PoseInputs): SolverSeed | undefined {
    return this.seeds.get(SeedBook.key(role, inputs));
  }

  get size(): number {
    return this.seeds.size;
  }
}

/** What an engine does with seeds: start its solves from one book, record its own into another (either may be absent). */
export interface SeedUse {
  replay?: SeedBook;
  record?: SeedBook;
}
