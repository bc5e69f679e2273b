/**
 * The sign conventions and definitions behind every analysis measure, as short sentences
 * that JSON reports carry beside the numbers (docs/conventions.md says the same at length).
 */

import { TIE_ROD_SPIN_TREATMENT } from './jointArticulation';
import { WARNING_FRACTION } from './tolerance';

export const ANALYSIS_DEFINITIONS = {
  axes: 'ISO 8855: x forward, y left, z up; origin on the ground midway between the front contact patches at design; mm and degrees',
  lean: 'roll of the frame about x; positive lowers the right side',
  handlebar: 'positive turns left',
  steer: 'road-wheel angle: heading of the wheel about the ground normal, positive left',
  toe: 'toe-in positive',
  camber:
    'top of the wheel outward positive: the inclination of the wheel plane itself (not its front-view projection) from the ground normal and from the frame z axis; camberFrontViewDeg is the front-view projection, equal straight ahead',
  caster: 'side view (x-z), top of the steering axis rearward positive',
  kpi: 'front view (y-z), top of the steering axis inward positive',
  trail: 'along the wheel heading on the ground: contact patch behind the axis ground point positive',
  scrubRadius: 'kingpin offset at ground, across the wheel: axis ground point inboard of the contact patch positive',
  casterOffset: 'at wheel-centre height along the heading: steering axis ahead of the wheel centre positive',
  kingpinOffsetAtCentre: 'at wheel-centre height across the wheel: steering axis inboard of the wheel centre positive',
  travel: 'wheel-centre travel relative to the frame, bump (wheel up) positive; a sweep on the ground sets it by heave = -travel',
  selfSteer:
    'lean steer and bump steer: road-wheel angle at zero handlebar at this lean and travel minus that at zero handlebar, lean and travel (positive left); depends on lean and travel only',
  ratioChange:
    'steering-ratio change: 100 (local ratio upright / local ratio here - 1), upright = zero lean and travel at the same handlebar; positive = quicker steering than upright',
  toeMismatch: 'how far the two wheels are from a common turn centre: the front slip angles (judged) and the Ackermann error',
  verdict: 'within: inside the tolerance; close: has used 80 % or more of it; over: outside it; broken: the linkage cannot be assembled',
  slip: 'ISO 8855: from the wheel heading to its contact-centre velocity, anticlockwise from above positive; turn centre on the rear axle line where the front slip angles are equal and opposite',
  scrub: 'sideways scrub 1000 tan(slip) m per km travelled',
  ackermann:
    'adopted: 100 (inner - outer) / (inner - ideal outer) at the same inner angle; shown beside it: 100 (cot outer - cot inner) / (cot ideal outer - cot inner); ideal outer puts both axis lines through one point on the rear axle line; error = outer - ideal outer (positive: less Ackermann than ideal, relative toe-in)',
  turningCircle:
    'SAE J695: turning diameter to the outer front tyre contact centre, turn centre where the outer wheel axis line meets the rear axle line; kerb to kerb adds the tread width; wall to wall encloses body outline and tyres',
  transmission: 'asin of the cosine between a link and the path of the lever joint it drives: 90 ideal, 0 dead centre; positive on the design side',
  motionRatio: 'spring length change per wheel-centre travel, steering held; positive when the spring shortens as the wheel rises',
  leanLinkage:
    'balance-beam lean linkage: on the ground the heave input is the spring travel (extension +, as a frame heave: a sweep with wheel travel t sets heave -t, compressing the spring by t) and pure lean holds it; the frame height and lateral place are solved (mean y of the two front contact points 0); motion ratio = spring compression per mm of mean wheel-centre bump relative to the frame, lean and handlebar held (central difference, +/- 0.5 mm of spring travel)',
  rollAxis:
    'the frame\'s instantaneous screw axis relative to the ground between lean - 0.05 and lean + 0.05 deg (spring travel held): height and lateral place where it crosses x = 0, inclination to the ground (rising forward +), and where it meets the ground (absent below 0.1 deg of inclination: parallel to the ground)',
  rockerStops:
    'rocker angle relative to its carrier, right-handed about the rocker axis; stop margin = stop - |rocker angle|; lean at a stop = the frame lean solved with the rocker driven to that stop, the other inputs held',
  frontLift:
    'how far the front would rise, relative to straight ahead at the same lean and travel, with the suspension held: heave change + mean suspension travel taken up (lower-joint travel x wheel-per-joint ratio) - mean contact-height change; positive lifts',
  joints:
    'articulation: angle between housing axis and stud or bolt axis (both along studAxis at design); margin = rated - articulation; upper and lower outer joints: stud in the upright, or with a kingpin in the yoke the upright turns in (yoke to wishbone or member, no steering component)',
  tieRodSpin: TIE_ROD_SPIN_TREATMENT,
  clearance: 'surface-to-surface distance of capsules (wishbone arms, frame rails, tie rods, steering arms, crank arms or rack) and the tyre torus; negative = intersecting',
  close: `a measure is close once it has used ${WARNING_FRACTION * 100} % of what its tolerance allows`,
} as const;
