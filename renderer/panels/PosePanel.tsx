/** Sliders with numeric fields for lean, steer and travel, and the ground-contact toggle. */
import { useMemo } from 'react';
import { useThrottledSlice } from '../app/useThrottled';
import { useActions, useDocument, usePose, useUi, useWorkbenchApi } from '../app/workbenchContext';
import { POSE_LABELS, sliderRanges, type PoseField } from '../model/poseInputs';
import { motion } from '../viewport/viewSignals';
import { NumberField } from './NumberField';

const FIELDS: readonly PoseField[] = ['leanDeg', 'handlebarDeg', 'heaveMm', 'travelRightMm', 'travelLeftMm'];

export function PosePanel() {
  const design = useDocument((s) => s.design);
  const contact = usePose((s) => s.pose.contact);
  const actions = useActions();
  const ranges = useMemo(() => sliderRanges(design, contact), [design, contact]);
  return (
    <section className="panel pose-panel" aria-labelledby="pose-title">
      <h2 id="pose-title">Pose</h2>
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
      {FIELDS.map((f) => (
        <PoseSlider key={f} field={f} range={ranges[f]} />
      ))}
      <button type="button" className="link-button" onClick={() => actions.resetPose()}>
        Back to design position
      </button>
    </section>
  );
}

/** While playback runs, the sliders follow at this interval (the picture at the full rate), ms. */
const PLAYING_INTERVAL_MS = 250;

function PoseSlider({ field, range }: { field: PoseField; range: ReturnType<typeof sliderRanges>[PoseField] }) {
  const playing = useUi((s) => s.playback.playing);
  const value = useThrottledSlice(useWorkbenchApi().pose, (s) => s.pose[field], playing ? PLAYING_INTERVAL_MS : 0);
  const actions = useActions();
  const meta = POSE_LABELS[field];
  const set = (v: number) => {
    motion.emit();
    actions.setPose({ [field]: v });
  };
  const id = `slider-${field}`;
  const pct = (x: number) => ((x - range.min) / (range.max - range.min)) * 100;
  return (
    <div className={`pose-slider ${range.enabled ? '' : 'is-disabled'}`} title={range.enabled ? meta.hint : range.disabledReason}>
      <div className="pose-slider-head">
        <label htmlFor={id}>{meta.label}</label>
        <NumberField
          compact
          label={meta.label}
          unit={meta.unit}
          value={value}
          digits={field.endsWith('Deg') ? 1 : 0}
          disabled={!range.enabled}
          onCommit={set}
          testId={`pose-${field}`}
        />
      </div>
      <div className="slider-track">
        <span
          className="envelope-band"
          style={{ left: `${pct(range.envelopeMin)}%`, width: `${pct(range.envelopeMax) - pct(range.envelopeMin)}%` }}
          title={`design envelope ${range.envelopeMin} to ${range.envelopeMax} ${meta.unit}`}
        />
        <input
          id={id}
          type="range"
          min={range.min}
          max={range.max}
          step={range.step}
          value={value}
          disabled={!range.enabled}
          aria-valuetext={`${value} ${meta.unit}`}
          data-testid={`slider-${field}`}
          onChange={(e) => set(Number(e.target.value))}
          onDoubleClick={() => set(0)}
        />
      </div>
      {!range.enabled && <p className="hint">{range.disabledReason}</p>}
    </div>
  );
}
