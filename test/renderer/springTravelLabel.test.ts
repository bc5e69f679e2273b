/**
 * The pose panel's heave input is labelled as the spring travel on a design with a lean
 * linkage (core drives the linkage's carrier with it there) and as heave elsewhere.
 */
import { describe, expect, it } from 'vitest';
import { POSE_LABELS, poseLabel } from '../../renderer/model/poseInputs';
import { pipitDoc } from '../core/mechanism/pipitDemo';

describe('heave slider label', () => {
  it('says "Spring travel" for the Pipit and "Heave" once its lean linkage is removed', () => {
    const d = pipitDoc();
    expect(poseLabel('heaveMm', d).label).toBe('Spring travel');
    expect(poseLabel('heaveMm', d).hint).toMatch(/extension/);
    expect(poseLabel('leanDeg', d)).toBe(POSE_LABELS.leanDeg);
    delete d.leanLinkage;
    expect(poseLabel('heaveMm', d).label).toBe('Heave');
  });
});
