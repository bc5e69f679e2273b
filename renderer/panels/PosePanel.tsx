/**
 * Sliders with numeric fields for lean, steer and travel, the ground-contact toggle, and the
 * Lean / Ride switch: in ride mode a speed slider takes the lean's place as an input and the
 * lean slider follows core's balanced lean (disabled, still showing the value).
 */
import { useMemo } from 'react';
import { useThrottledSlice } from '../app/useThrottled';
import { useActions, useDocument, usePose, useUi, useWorkbenchApi } from '../app/workbenchContext';
import { poseLabel, rideSpeedRange, sliderRanges, type PoseField, type SliderRange } from '../model/poseInputs';
import { motion } from '../viewport/viewSignals';
import { NumberField } from './NumberField';

const FIELDS: readonly PoseField[] = ['leanDeg', 'handlebarDeg', 'heaveMm', 'travelRightMm', 'travelLeftMm'];

/** While playback runs, the sliders follow at this interval (the picture at the full rate), ms. */
const PLAYING_INTERVAL_MS = 250;
/** Ride notes repaint at most this often while the handlebar moves, ms. */
const NOTES_INTERVAL_MS = 100;

export const RIDE_LEAN_REASON = 'ride mode: the lean follows the balanced turn for the speed and handlebar';

export function PosePanel() {
  const design = useDocument((s) => s.design);
  const contact = usePose((s) => s.pose.contact);
  const riding = usePose((s) => s.ride.on);
  const actions = useActions();
  const ranges = useMemo(() => {
    const r = sliderRanges(design, contact);
    return riding && r.leanDeg.enabled ? { ...r, leanDeg: { ...r.leanDeg, enabled: false, disabledReason: RIDE_LEAN_REASON } } : r;
  }, [design, contact, riding]);
  return (
    <section className="panel pose-panel" aria-labelledby="pose-title">
      <h2 id="pose-title">Pose</h2>
      <div className="mode-toggle" role="radiogroup" aria-label="Pose input">
        <label title="set the lean yourself">
          <input type="radio" name="pose-mode" checked={!riding} onChange={() => actions.setRide({ on: false })} data-testid="mode-lean" />
          Lean
        </label>
        <label title="set a speed; the lean is the one that balances the turn">
          <input type="radio" name="pose-mode" checked={riding} onChange={() => actions.setRide({ on: true })} data-testid="mode-ride" />
          Ride
        </label>
      </div>
      <div className="contact-toggle" role="radiogroup" aria-label="Wheel contact">
        <label>
          <input type="radio" name="contact" checked={contact === 'ground'} onChange={() => actions.setContact('ground')} />
          Tyres on the ground
        </label>
        <label>
          <input type="radio" name="contact" checked={contact === 'travel'} onChange={() => actions.setContact('travel')} />
          Set wheel travel
        </label>
      </div>
      {riding && <SpeedSlider />}
      {FIELDS.map((f) => (
        <PoseSlider key={f} field={f} range={ranges[f]} />
      ))}
      {riding && <RideNotes />}
      <button type="button" className="link-button" onClick={() => actions.resetPose()}>
        Back to design position
      </button>
    </section>
  );
}

interface SliderRowProps {
  id: string;
  label: string;
  unit: string;
  hint: string;
  value: number;
  digits: number;
  range: SliderRange;
  onSet(v: number): void;
}

/** A labelled slider with its number field, the design's band marked on the track. */
function SliderRow({ id, label, unit, hint, value, digits, range, onSet }: SliderRowProps) {
  const htmlId = `slider-${id}`;
  const pct = (x: number) => ((x - range.min) / (range.max - range.min)) * 100;
  return (
    <div className={`pose-slider ${range.enabled ? '' : 'is-disabled'}`} title={range.enabled ? hint : range.disabledReason}>
      <div className="pose-slider-head">
        <label htmlFor={htmlId}>{label}</label>
        <NumberField compact label={label} unit={unit} value={value} digits={digits} disabled={!range.enabled} onCommit={onSet} testId={`pose-${id}`} />
      </div>
      <div className="slider-track">
        <span
          className="envelope-band"
          style={{ left: `${pct(range.envelopeMin)}%`, width: `${pct(range.envelopeMax) - pct(range.envelopeMin)}%` }}
          title={`design envelope ${range.envelopeMin} to ${range.envelopeMax} ${unit}`}
        />
        <input
          id={htmlId}
          type="range"
          min={range.min}
          max={range.max}
          step={range.step}
          value={value}
          disabled={!range.enabled}
          aria-valuetext={`${value} ${unit}`}
          data-testid={htmlId}
          onChange={(e) => onSet(Number(e.target.value))}
          onDoubleClick={() => onSet(0)}
        />
      </div>
      {!range.enabled && <p className="hint">{range.disabledReason}</p>}
    </div>
  );
}

function PoseSlider({ field, range }: { field: PoseField; range: SliderRange }) {
  const playing = useUi((s) => s.playback.playing);
  const value = useThrottledSlice(useWorkbenchApi().pose, (s) => s.pose[field], playing ? PLAYING_INTERVAL_MS : 0);
  const actions = useActions();
  const meta = poseLabel(field, useDocument((s) => s.design));
  const set = (v: number) => {
    motion.emit();
    actions.setPose({ [field]: v });
  };
  return <SliderRow id={field} label={meta.label} unit={meta.unit} hint={meta.hint} value={value} digits={field.endsWith('Deg') ? 1 : 0} range={range} onSet={set} />;
}

function SpeedSlider() {
  const speed = usePose((s) => s.ride.speedKmh ?? 0);
  const riding = usePose((s) => s.resolved?.riding ?? null);
  const actions = useActions();
  const range = useMemo(() => rideSpeedRange(riding), [riding]);
  const set = (v: number) => {
    motion.emit();
    actions.setRide({ speedKmh: Math.max(0, v) });
  };
  return (
    <SliderRow
      id="speedKmh"
      label="Speed"
      unit="km/h"
      hint="riding speed; the lean is the one that balances the turn the handlebar makes, tan(lean) = v² / (g R)"
      value={speed}
      digits={1}
      range={range}
      onSet={set}
    />
  );
}

/** Core's notes on the ride pose (lean limit, grip, straight ahead), where the designer sees them. */
function RideNotes() {
  const notes = useThrottledSlice(useWorkbenchApi().pose, (s) => s.outcome.ride?.notes, NOTES_INTERVAL_MS);
  if (!notes || notes.length === 0) return null;
  return (
    <ul className="ride-notes" data-testid="ride-notes">
      {notes.map((n) => (
        <li key={n} className="hint">
          {n}
        </li>
      ))}
    </ul>
  );
}
