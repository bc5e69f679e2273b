/** The ground: a plain line grid (100 mm minor, 500 mm major lines) and the vehicle axes. */
import { useMemo } from 'react';
import { BufferGeometry, Float32BufferAttribute } from 'three';
import { PART_COLOUR } from '../model/severity';

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

export function GroundGrid({ rearX }: { rearX: number }) {
  const x0 = Math.floor((rearX - 600) / MAJOR) * MAJOR;
  const { minor, major, axes } = useMemo(() => {
    const axesG = new BufferGeometry();
    axesG.setAttribute('position', new Float32BufferAttribute([0, 0, 0.5, 300, 0, 0.5, 0, 0, 0.5, 0, 300, 0.5, 0, 0, 0, 0, 0, 300], 3));
    axesG.setAttribute(
      'color',
      new Float32BufferAttribute([0.75, 0.25, 0.2, 0.75, 0.25, 0.2, 0.2, 0.55, 0.3, 0.2, 0.55, 0.3, 0.2, 0.35, 0.75, 0.2, 0.35, 0.75], 3),
    );
    return { minor: gridGeometry(x0, 1000, -1000, 1000, MINOR, MAJOR), major: gridGeometry(x0, 1000, -1000, 1000, MAJOR, 0), axes: axesG };
  }, [x0]);
  return (
    <group>
      <lineSegments geometry={minor} raycast={() => null}>
        <lineBasicMaterial color={PART_COLOUR.ground} />
      </lineSegments>
      <lineSegments geometry={major} raycast={() => null}>
        <lineBasicMaterial color={PART_COLOUR.groundMajor} />
      </lineSegments>
      <lineSegments geometry={axes} raycast={() => null}>
        <lineBasicMaterial vertexColors />
      </lineSegments>
    </group>
  );
}
