/**
 * Design-level fields: name and notes, vehicle and layout, steering mechanism, wheels, joint
 * ratings, envelope, tolerances and part sizes, one section each. Every edit is an undoable
 * action; the validator's message appears at the field it names (sheetFields.tsx).
 */
import { useState } from 'react';
import { isTwoSided } from '../../core/design/resolveDesign';
import { starterLeaningRear } from '../../core/design/rearPairStarter';
import { DEFAULT_PART_SIZES, DEFAULT_TOLERANCES, type DesignFile, type Joints } from '../../core/design/types';
import { useActions, useDocument, usePose } from '../app/workbenchContext';
import { setField, setFields } from '../model/designActions';
import { starterCrankInput, starterFrontEnd, starterLeanLinkage, starterSpring, starterSteering, starterTrackRodDrive } from '../model/designStarters';
import { issuesAt } from '../model/fieldIssues';
import { Choice, Num, Section, SidedNum, Vec } from './sheetFields';

/** Replace several fields as one undoable step. */
function useReplace(): (values: { path: string; value: unknown }[], label: string) => void {
  const actions = useActions();
  return (values, label) => actions.perform(setFields, { values, label });
}

export function DesignSheet() {
  const design = useDocument((s) => s.design);
  return (
    <section className="panel design-sheet" aria-labelledby="sheet-title">
      <h2 id="sheet-title">Design sheet</h2>
      <NameAndNotes design={design} />
      <VehicleAndLayout design={design} />
      <SteeringMechanism design={design} />
      <WheelsSection />
      <JointRatings design={design} />
      <Section title="Envelope">
        <Num path="envelope.leanDeg" label="Lean each way" unit="deg" />
        <Num path="envelope.handlebarDeg" label="Handlebar lock each way" unit="deg" />
        <Num path="envelope.bumpMm" label="Bump" unit="mm" />
        <Num path="envelope.reboundMm" label="Rebound" unit="mm" />
      </Section>
      <Section title="Tolerances">
        <Num path="tolerances.selfSteerDeg" label="Self-steer" unit="deg" fallback={DEFAULT_TOLERANCES.selfSteerDeg} />
        <Num path="tolerances.ratioChangePct" label="Steering-ratio change" unit="%" fallback={DEFAULT_TOLERANCES.ratioChangePct} />
        <Num path="tolerances.slipDeg" label="Slip (scrub)" unit="deg" fallback={DEFAULT_TOLERANCES.slipDeg} />
        <Num path="tolerances.jointMarginDeg" label="Joint margin" unit="deg" fallback={DEFAULT_TOLERANCES.jointMarginDeg} />
        <Num path="tolerances.clearanceMm" label="Clearance" unit="mm" fallback={DEFAULT_TOLERANCES.clearanceMm} />
      </Section>
      <Section title="Part sizes (for clearance checks)">
        <Num path="parts.wishboneTubeRadiusMm" label="Wishbone tube radius" unit="mm" fallback={DEFAULT_PART_SIZES.wishboneTubeRadiusMm} />
        <Num path="parts.tieRodRadiusMm" label="Tie rod radius" unit="mm" fallback={DEFAULT_PART_SIZES.tieRodRadiusMm} />
        <Num path="parts.steeringArmRadiusMm" label="Steering arm radius" unit="mm" fallback={DEFAULT_PART_SIZES.steeringArmRadiusMm} />
      </Section>
    </section>
  );
}

/** Name and notes are typed as drafts and committed as one edit when the field is left. */
function NameAndNotes({ design: d }: { design: DesignFile }) {
  const actions = useActions();
  const [notesDraft, setNotesDraft] = useState<string | null>(null);
  const [nameDraft, setNameDraft] = useState<string | null>(null);
  const nameIssues = issuesAt(usePose((s) => s.issues), 'name');
  return (
    <Section title="Name and notes" open>
      <label className="text-field">
        <span className="nf-label">Name</span>
        <input
          type="text"
          value={nameDraft ?? d.name}
          data-testid="field-name"
          onChange={(e) => setNameDraft(e.target.value)}
          onBlur={() => {
            if (nameDraft !== null && nameDraft !== d.name) actions.perform(setField, { path: 'name', value: nameDraft, label: 'rename the design' });
            setNameDraft(null);
          }}
          onKeyDown={(e) => e.key === 'Enter' && (e.target as HTMLInputElement).blur()}
        />
        {nameIssues.length > 0 && <span className="field-error" role="alert">{nameIssues.map((i) => i.message).join(' ')}</span>}
      </label>
      <label className="text-field">
        <span className="nf-label">Notes</span>
        <textarea
          rows={3}
          value={notesDraft ?? d.notes ?? ''}
          onChange={(e) => setNotesDraft(e.target.value)}
          onBlur={() => {
            if (notesDraft !== null && notesDraft !== (d.notes ?? '')) {
              actions.perform(setField, { path: 'notes', value: notesDraft === '' ? undefined : notesDraft, label: 'edit the notes' });
            }
            setNotesDraft(null);
          }}
        />
      </label>
    </Section>
  );
}

function VehicleAndLayout({ design: d }: { design: DesignFile }) {
  const replace = useReplace();
  return (
    <Section title="Vehicle and layout">
      <Num path="vehicle.wheelbaseMm" label="Wheelbase" unit="mm" />
      <div className="sheet-row">
        <label className="check">
          <input
            type="checkbox"
            checked={d.vehicle.tilting}
            data-testid="field-vehicle.tilting"
            onChange={(e) =>
              replace(
                // A vehicle that stops leaning loses its lean envelope with it.
                [{ path: 'vehicle.tilting', value: e.target.checked }, ...(e.target.checked ? [] : [{ path: 'envelope.leanDeg', value: 0 }])],
                e.target.checked ? 'make the vehicle lean' : 'make the vehicle non-tilting',
              )
            }
          />
          The frame leans (tilting vehicle)
        </label>
      </div>
      <Choice
        path="vehicle.rear.kind"
        label="Rear"
        options={[
          { value: 'single', label: 'one rear wheel' },
          { value: 'pair', label: 'a pair of rear wheels' },
          { value: 'leaningPair', label: 'a leaning rear pair (tilting quadricycle)' },
        ]}
        onPick={(v) =>
          replace(
            [{ path: 'vehicle.rear', value: v === 'pair' ? { kind: 'pair', trackMm: 700 } : v === 'leaningPair' ? starterLeaningRear(d) : { kind: 'single' } }],
            `set rear: ${v}`,
          )
        }
      />
      {d.vehicle.rear.kind === 'pair' && <Num path="vehicle.rear.trackMm" label="Rear track" unit="mm" />}
      <FrontSuspension design={d} />
      <SpringMount design={d} />
      <LeanLinkageBlock design={d} />
    </Section>
  );
}

function FrontSuspension({ design: d }: { design: DesignFile }) {
  const replace = useReplace();
  return (
    <>
      <Choice
        path="frontEnd.kind"
        label="Front suspension"
        options={[
          { value: 'splitWishbones', label: 'split wishbones (per side)' },
          { value: 'centrePivot', label: 'centre-pivot members' },
        ]}
        onPick={(v) =>
          replace(
            // A lean linkage's push links act on split wishbones: switching to members drops it in the same step.
            [{ path: 'frontEnd', value: starterFrontEnd(d, v) }, ...(v === 'centrePivot' && d.leanLinkage ? [{ path: 'leanLinkage', value: undefined }] : [])],
            `switch to ${v === 'centrePivot' ? 'centre-pivot members' : 'split wishbones'}`,
          )
        }
      />
      {d.frontEnd.kind === 'centrePivot' && (
        <>
          <Vec path="frontEnd.upper.pivotAxis" label="Upper member pivot axis" unit="" />
          <Vec path="frontEnd.lower.pivotAxis" label="Lower member pivot axis" unit="" />
        </>
      )}
      <Choice
        path="upright.steeringAxis"
        label="Steering axis"
        options={[
          { value: 'ballJoints', label: 'two ball joints' },
          { value: 'kingpin', label: 'kingpin bolt' },
        ]}
      />
      <SidedNum path="upright.staticToeDeg" label="Static toe (toe-in +)" unit="deg" />
      <SidedNum path="upright.staticCamberDeg" label="Static camber (top out +)" unit="deg" />
    </>
  );
}

function SpringMount({ design: d }: { design: DesignFile }) {
  const replace = useReplace();
  return (
    <>
      <div className="sheet-row">
        <label className="check">
          <input
            type="checkbox"
            checked={d.spring !== undefined}
            onChange={(e) => replace([{ path: 'spring', value: e.target.checked ? starterSpring(d) : undefined }], e.target.checked ? 'add a spring' : 'remove the spring')}
          />
          Spring or damper mount
        </label>
      </div>
      {d.spring && (
        <Choice
          path="spring.on"
          label="Spring acts on"
          options={[
            { value: 'lower', label: 'lower arm' },
            { value: 'upper', label: 'upper arm' },
          ]}
        />
      )}
    </>
  );
}

/** The balance-beam lean linkage: offered on split wishbones of a tilting vehicle (where the validator accepts it). */
function LeanLinkageBlock({ design: d }: { design: DesignFile }) {
  const replace = useReplace();
  const possible = d.frontEnd.kind === 'splitWishbones' && d.vehicle.tilting;
  if (!possible && !d.leanLinkage) return null;
  return (
    <>
      <div className="sheet-row">
        <label className="check">
          <input
            type="checkbox"
            checked={d.leanLinkage !== undefined}
            onChange={(e) =>
              replace([{ path: 'leanLinkage', value: e.target.checked ? (starterLeanLinkage(d) ?? undefined) : undefined }], e.target.checked ? 'add a lean linkage' : 'remove the lean linkage')
            }
          />
          Balance-beam lean linkage (rocker, push links, spring on a carrier)
        </label>
      </div>
      {d.leanLinkage && <Num path="leanLinkage.rocker.stopDeg" label="Rocker stops (each way)" unit="deg" />}
    </>
  );
}

/** A handlebar fixed to an upright turns it about its kingpin: the upright switches to a kingpin in the same step. */
const kingpinFor = (kind: string) => (kind === 'knuckle' ? [{ path: 'upright.steeringAxis', value: 'kingpin' }] : []);

function SteeringMechanism({ design: d }: { design: DesignFile }) {
  const replace = useReplace();
  const st = d.steering;
  return (
    <Section title="Steering mechanism">
      <Choice
        path="steering.kind"
        label="Mechanism"
        options={[
          { value: 'bellCrank', label: 'bell crank' },
          { value: 'rack', label: 'rack' },
          { value: 'direct', label: 'lever on the column' },
          { value: 'trackRod', label: 'one-piece track rod' },
        ]}
        onPick={(v) =>
          replace(
            // A track rod's two ends are both rod ends on the steering arms: the inner joint takes the outer one's spec.
            [{ path: 'steering', value: starterSteering(d, v) }, ...(v === 'trackRod' ? [{ path: 'joints.tieRodInner', value: d.joints.tieRodOuter }] : [])],
            `switch the steering to ${v}`,
          )
        }
      />
      {(st.kind === 'bellCrank' || st.kind === 'direct') && <Vec path="steering.axis" label={st.kind === 'bellCrank' ? 'Crank pivot axis' : 'Column axis'} unit="" />}
      {st.kind === 'trackRod' && (
        <>
          <Choice
            path="steering.drive.kind"
            label="Track rod driven by"
            options={[
              { value: 'dragLink', label: 'drag link to one upright' },
              { value: 'knuckle', label: 'handlebar on one upright (kingpin)' },
              { value: 'centreLever', label: 'centre lever and short link' },
            ]}
            onPick={(v) => replace([{ path: 'steering.drive', value: starterTrackRodDrive(d, v) }, ...kingpinFor(v)], `drive the track rod by ${v}`)}
          />
          {st.drive.kind === 'dragLink' && <Vec path="steering.drive.columnAxis" label="Column axis" unit="" />}
          {st.drive.kind === 'centreLever' && <Vec path="steering.drive.axis" label="Lever axis" unit="" />}
        </>
      )}
      {st.kind === 'rack' && (
        <>
          <Vec path="steering.axis" label="Rack slide direction" unit="" />
          <Num path="steering.mmPerHandlebarDeg" label="Rack travel per handlebar degree" unit="mm/deg" />
        </>
      )}
      {st.kind === 'bellCrank' && (
        <>
          <Choice
            path="steering.input.kind"
            label="Crank input"
            options={[
              { value: 'ratio', label: 'fixed ratio (tiller, gears)' },
              { value: 'dragLink', label: 'drag link from a column' },
              { value: 'knuckle', label: 'handlebar on one upright (kingpin)' },
            ]}
            onPick={(v) => {
              const input = starterCrankInput(d, v);
              if (input) replace([{ path: 'steering.input', value: input }, ...kingpinFor(v)], `switch the crank input to ${v}`);
            }}
          />
          {st.input.kind === 'ratio' && <Num path="steering.input.crankDegPerHandlebarDeg" label="Crank turn per handlebar degree" unit="deg/deg" />}
          {st.input.kind === 'dragLink' && <Vec path="steering.input.columnAxis" label="Column axis" unit="" />}
        </>
      )}
    </Section>
  );
}

function WheelsSection() {
  return (
    <Section title="Wheels">
      {(['front', 'rear'] as const).map((axle) => (
        <fieldset key={axle} className="sheet-group">
          <legend>{axle === 'front' ? 'Front tyres' : 'Rear tyre'}</legend>
          <Num path={`wheels.${axle}.rollingRadiusMm`} label="Rolling radius" unit="mm" />
          <Num path={`wheels.${axle}.tyreWidthMm`} label="Tyre width" unit="mm" />
          <Num path={`wheels.${axle}.crownRadiusMm`} label="Crown radius" unit="mm" />
        </fieldset>
      ))}
    </Section>
  );
}

const JOINTS: { key: keyof Joints; label: string }[] = [
  { key: 'upperOuter', label: 'Upper outer joint' },
  { key: 'lowerOuter', label: 'Lower outer joint' },
  { key: 'tieRodOuter', label: 'Tie rod, outer end' },
  { key: 'tieRodInner', label: 'Tie rod, inner end' },
];

function JointRatings({ design: d }: { design: DesignFile }) {
  return (
    <Section title="Joint ratings">
      {JOINTS.map((j) => (
        <fieldset key={j.key} className="sheet-group">
          <legend>{j.label}</legend>
          <Choice
            path={`joints.${j.key}.kind`}
            label="Kind"
            options={[
              { value: 'ballJoint', label: 'ball joint' },
              { value: 'rodEnd', label: 'rod end' },
            ]}
          />
          <Num path={`joints.${j.key}.ratedDeg`} label="Rated articulation" unit="deg" />
          {isTwoSided(d.joints[j.key].studAxis) ? (
            <>
              <Vec path={`joints.${j.key}.studAxis.right`} label="Stud axis, right" unit="" />
              <Vec path={`joints.${j.key}.studAxis.left`} label="Stud axis, left" unit="" />
            </>
          ) : (
            <Vec path={`joints.${j.key}.studAxis`} label="Stud axis (right; mirrored)" unit="" />
          )}
        </fieldset>
      ))}
    </Section>
  );
}
