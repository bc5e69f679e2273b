import type { CliIo } from '../io';
import { loadDesignOrReport, reportArgError } from '../commandSupport';
import { EXIT_BAD_INPUT, EXIT_CODES_HELP, EXIT_FAILED, EXIT_OK, SAFETY_CAUTION } from '../io';
import { ArgError, numberOption, parseArgs } from '../args';
import { limitedOption, POSE_INPUT_LIMITS as LIMIT, POSE_LIMITS_HELP, requireWithin } from '../inputLimits';
import { quoted } from '../safeText';
import { PoseRequestError, solveSinglePose, type PoseRequest } from '../../analysis/solveSinglePose';
import { parseHold } from './sweep';

export const poseHelp = `tiltbench pose [design.tiltsheet] (--lean DEG | --speed KMH) --steer DEG [--travel MM | --on-ground | --hold suspension] [--json]
  Solves one pose of the closed linkage and prints every measure, every hardpoint's posed
  position and, per wheel, toe and camber. Without a design it uses the bundled demo.
  --lean DEG          frame roll, positive lowers the right side (leaning into a right turn)
  --speed KMH         instead of --lean: the lean at which the vehicle balances in the turn the
                      handlebar makes at this speed, tan(lean) = v^2 / (g R); prints the lean
                      found and the balance residual
  --steer DEG         handlebar angle, positive turns left
  --wheel-angle DEG   instead of --steer: target road-wheel angle of the wheel named by --wheel
  --wheel left|right  which wheel --wheel-angle sets (default left)
  --on-ground         both tyres on the ground (the default)
  --travel MM         wheel-centre travel relative to the frame instead of ground contact
                      (positive up; a centre-pivot design takes it on the right wheel)
  --travel-left MM, --travel-right MM   per-side travel (split wishbones)
  --heave MM          frame height change (ignored where ground contact sets it); with a lean
                      linkage (leanLinkage) on the ground: the spring travel, + = extension
  --lean-by rocker    with a lean linkage: the rocker angle is the input (tilt lock or lean
                      actuator) and the frame lean is solved and reported; give --rocker
  --rocker DEG        rocker angle relative to its carrier, right-handed about the rocker axis
  --hold suspension   steering only, with the wishbones or centre members held at their design
                      position (as on a jig, to compare with bench measurements): no ground
                      contact, lean 0, travel 0; takes no --lean, --speed, --travel, --heave
                      or --on-ground
  --json              machine-readable output
  ${POSE_LIMITS_HELP}
  Exit 0 when solved, 1 when the linkage cannot be assembled there, 2 for bad input.
  ${EXIT_CODES_HELP}`;

export async function runPose(argv: string[], io: CliIo): Promise<number> {
  let request: PoseRequest;
  let json: boolean;
  let designPath: string | undefined;
  try {
    const args = parseArgs(argv, {
      flags: ['json', 'on-ground'],
      values: ['lean', 'speed', 'steer', 'travel', 'travel-left', 'travel-right', 'heave', 'wheel-angle', 'wheel', 'hold', 'lean-by', 'rocker'],
    });
    const leanBy = args.options.get('lean-by');
    if (leanBy !== undefined && leanBy !== 'rocker' && leanBy !== 'frame') {
      throw new ArgError(`option --lean-by: expected rocker or frame, found ${leanBy === true ? 'no value' : quoted(leanBy)}`);
    }
    const byRocker = leanBy === 'rocker';
    if (byRocker && (args.options.has('lean') || args.options.has('speed'))) throw new ArgError('--lean-by rocker takes --rocker DEG instead of --lean or --speed (the lean is solved)');
    if (!byRocker && args.options.has('rocker')) throw new ArgError('--rocker needs --lean-by rocker');
    const hold = parseHold(args, ['lean', 'speed', 'travel', 'travel-left', 'travel-right', 'heave', 'on-ground']);
    if (args.positionals.length > 1) throw new ArgError(`expected at most one design file, found ${args.positionals.length}`);
    designPath = args.positionals[0];
    json = args.options.has('json');
    const travelGiven = ['travel', 'travel-left', 'travel-right'].some((n) => args.options.has(n));
    if (travelGiven && args.options.has('on-ground')) throw new ArgError('give either --travel or --on-ground, not both');
    const travel = limitedOption(args, 'travel', LIMIT.travelMm, 0);
    const wheel = args.options.get('wheel') ?? 'left';
    if (wheel !== 'left' && wheel !== 'right') throw new ArgError(`option --wheel: expected left or right, found ${wheel === true ? 'no value' : quoted(wheel)}`);
    if (args.options.has('wheel-angle') && args.options.has('steer')) throw new ArgError('give either --steer or --wheel-angle, not both');
    if (args.options.has('speed') && args.options.has('lean')) throw new ArgError('give either --lean or --speed, not both (the speed sets the lean)');
    const speed = args.options.has('speed') ? numberOption(args, 'speed', 'km/h', 0) : undefined;
    if (speed !== undefined && !(speed >= 0)) throw new ArgError(`option --speed: expected a speed of 0 km/h or more, found ${speed}`);
    if (speed !== undefined) requireWithin(speed, LIMIT.speedKmh, 'option --speed');
    request = {
      leanDeg: byRocker ? limitedOption(args, 'rocker', LIMIT.leanDeg, 0) : limitedOption(args, 'lean', LIMIT.leanDeg, 0),
      ...(byRocker ? { leanBy: 'rocker' } : {}),
      handlebarDeg: limitedOption(args, 'steer', LIMIT.handlebarDeg, 0),
      heaveMm: limitedOption(args, 'heave', LIMIT.heaveMm, 0),
      // Held, no row of the mechanism reads the contact; travel (all zero) says the tyres are not asked to touch.
      contact: travelGiven || hold ? 'travel' : 'ground',
      ...(hold ? { hold } : {}),
      travelRightMm: limitedOption(args, 'travel-right', LIMIT.travelMm, travel),
      travelLeftMm: limitedOption(args, 'travel-left', LIMIT.travelMm, travel),
      ...(speed !== undefined ? { speedKmh: speed } : {}),
      ...(args.options.has('wheel-angle')
        ? { steerBy: wheel === 'left' ? 'leftWheel' : 'rightWheel', wheelAngleDeg: limitedOption(args, 'wheel-angle', LIMIT.wheelAngleDeg, 0) }
        : { steerBy: 'handlebar', wheelAngleDeg: 0 }),
    } as PoseRequest;
  } catch (e) {
    return reportArgError(e, io, 'pose', poseHelp);
  }
  const loaded = loadDesignOrReport(designPath, io);
  if (!loaded) return EXIT_BAD_INPUT;
  let out: ReturnType<typeof solveSinglePose>;
  try {
    out = solveSinglePose(loaded.design, request);
  } catch (e) {
    if (e instanceof PoseRequestError) {
      io.err(`tiltbench pose: ${e.message}\n`);
      return EXIT_BAD_INPUT;
    }
    throw e;
  }
  const solved = out.result.reached;
  if (json) {
    io.out(JSON.stringify({ design: loaded.path, ...out.report, caution: SAFETY_CAUTION }, null, 2) + '\n');
  } else {
    io.out(out.text + '\n' + SAFETY_CAUTION + '\n');
  }
  if (out.result.status === 'invalid-input') return EXIT_BAD_INPUT;
  return solved ? EXIT_OK : EXIT_FAILED;
}
