/**
 * The ground: a plain surface, a line grid (100 mm minor, 500 mm major lines), the vehicle's
 * axes at the origin, L and R beside the front wheels and an arrow pointing forward with its
 * word (the letters and the word face the camera, so they read in every view).
 */
import { useEffect, useMemo, useSyncExternalStore } from 'react';
import { BufferGeometry, DoubleSide, Float32BufferAttribute } from 'three';
import { VIEW_COLOUR } from './palette';
import { arrowGeometry, groundMarkPlaces } from './markGeometry';
import { TextLabel } from './textLabel';
import { shownView, viewShown } from './viewSignals';

const MINOR = 100;
const MAJOR = 500;

function gridGeometry(x0: number, x1: number, y0: number, y1: number, step: number, skip: number): BufferGeometry {
  const pos: number[] = [];
  for (let x = Math.ceil(x0 / step) * step; x <= x1; x += step) if (skip === 0 || x % skip !== 0) pos.push(x, y0, 0, x, y1, 0);
  for (let y = Math.ceil(y0 / step) * step; y <= y1; y += step) if (skip === 0 || y % skip !== 0) pos.push(x0, y, 0, x1, y, 0);
  const g = new BufferGeometry();
  g.setAttribute('position', new Float32BufferAttribute(pos, 3));
  return g;
}

/**
 * `rearX`: x of the rearmost thing drawn; `halfTrack`: |y| of the front contact patches;
 * `frontReach`: how far ahead of the origin the front tyres reach.
 */
export function GroundGrid({ rearX, halfTrack, frontReach }: { rearX: number; halfTrack: number; frontReach: number }) {
  const x0 = Math.floor((rearX - 2500) / MAJOR) * MAJOR;
  const x1 = Math.max(2500, Math.ceil((frontReach + 2500) / MAJOR) * MAJOR);
  const y1 = Math.max(3000, Math.ceil((halfTrack + 2500) / MAJOR) * MAJOR);
  // In the front elevation the arrow is edge-on and its word would sit in the middle of the picture.
  const view = useSyncExternalStore((cb) => viewShown.on(cb), () => shownView.current);
  const { minor, major, axes } = useMemo(() => {
    const axesG = new BufferGeometry();
    axesG.setAttribute('position', new Float32BufferAttribute([0, 0, 0.5, 300, 0, 0.5, 0, 0, 0.5, 0, 300, 0.5, 0, 0, 0, 0, 0, 300], 3));
    axesG.setAttribute(
      'color',
      new Float32BufferAttribute([0.75, 0.25, 0.2, 0.75, 0.25, 0.2, 0.2, 0.55, 0.3, 0.2, 0.55, 0.3, 0.2, 0.35, 0.75, 0.2, 0.35, 0.75], 3),
    );
    return { minor: gridGeometry(x0, x1, -y1, y1, MINOR, MAJOR), major: gridGeometry(x0, x1, -y1, y1, MAJOR, 0), axes: axesG };
  }, [x0, x1, y1]);
  const arrow = useMemo(() => arrowGeometry(), []);
  const labels = useMemo(() => {
    const style = { colour: '#ffffff', backdrop: VIEW_COLOUR.groundMark, height: 90, bold: true };
    return { left: new TextLabel('L', style), right: new TextLabel('R', style), front: new TextLabel('front', { ...style, height: 70 }) };
  }, []);
  useEffect(() => () => Object.values(labels).forEach((l) => l.dispose()), [labels]);
  const places = groundMarkPlaces(halfTrack, frontReach);
  const { arrowLen, arrowX } = places;
  return (
    <group>
      <mesh position={[(x0 + x1) / 2, 0, -0.6]} raycast={() => null} renderOrder={-2}>
        <planeGeometry args={[x1 - x0, 2 * y1]} />
        <meshBasicMaterial color={VIEW_COLOUR.ground} side={DoubleSide} />
      </mesh>
      <lineSegments geometry={minor} raycast={() => null}>
        <lineBasicMaterial color={VIEW_COLOUR.gridMinor} />
      </lineSegments>
      <lineSegments geometry={major} raycast={() => null}>
        <lineBasicMaterial color={VIEW_COLOUR.gridMajor} />
      </lineSegments>
      <lineSegments geometry={axes} raycast={() => null}>
        <lineBasicMaterial vertexColors />
      </lineSegments>
      <mesh geometry={arrow} position={[arrowX, 0, 1]} scale={[arrowLen, arrowLen, 1]} raycast={() => null}>
        <meshBasicMaterial color={VIEW_COLOUR.groundMark} side={DoubleSide} />
      </mesh>
      <primitive object={labels.left.sprite} position={places.left} />
      <primitive object={labels.right.sprite} position={places.right} />
      <primitive object={labels.front.sprite} position={places.front} visible={view !== 'front'} />
    </group>
  );
}
