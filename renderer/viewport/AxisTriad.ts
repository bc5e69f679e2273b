/**
 * A small labelled axis triad (ISO 8855: x forward, y left, z up) in the viewport's upper right
 * corner, turned with the camera. Its own scene and orthographic camera, drawn after the main
 * picture into a corner of the canvas (no extra canvas, three lines, three cones, three labels).
 */
import { BufferGeometry, ConeGeometry, Float32BufferAttribute, LineBasicMaterial, LineSegments, Mesh, MeshBasicMaterial, OrthographicCamera, Scene, Vector2, Vector3, type Camera, type WebGLRenderer } from 'three';
import { TextLabel } from './textLabel';

/** Size of the triad's square, CSS pixels. */
export const TRIAD_PX = 110;

const AXES: { dir: [number, number, number]; colour: string; label: string }[] = [
  { dir: [1, 0, 0], colour: '#b8432f', label: 'x fwd' },
  { dir: [0, 1, 0], colour: '#2f7d45', label: 'y left' },
  { dir: [0, 0, 1], colour: '#2f55b0', label: 'z up' },
];

export class AxisTriad {
  private readonly scene = new Scene();
  private readonly camera = new OrthographicCamera(-1.95, 1.95, 1.95, -1.95, 0.1, 20);
  private readonly labels: TextLabel[] = [];
  private readonly back = new Vector3();
  private readonly size = new Vector2();

  constructor() {
    const pos: number[] = [];
    const col: number[] = [];
    for (const a of AXES) {
      pos.push(0, 0, 0, a.dir[0] * 0.8, a.dir[1] * 0.8, a.dir[2] * 0.8);
      const c = parseInt(a.colour.slice(1), 16);
      for (let k = 0; k < 2; k++) col.push(((c >> 16) & 255) / 255, ((c >> 8) & 255) / 255, (c & 255) / 255);
      // No depth test: the triad is drawn over the picture without clearing the depth buffer (a full-canvas pass on the CPU).
      const cone = new Mesh(new ConeGeometry(0.09, 0.3, 12), new MeshBasicMaterial({ color: a.colour, depthTest: false, depthWrite: false }));
      cone.position.set(a.dir[0] * 0.9, a.dir[1] * 0.9, a.dir[2] * 0.9);
      cone.quaternion.setFromUnitVectors(new Vector3(0, 1, 0), new Vector3(...a.dir));
      this.scene.add(cone);
      const label = new TextLabel(a.label, { colour: a.colour, backdrop: 'rgba(255,255,255,0.8)', height: 0.42, bold: true });
      label.sprite.position.set(a.dir[0] * 1.4, a.dir[1] * 1.4, a.dir[2] * 1.4);
      this.scene.add(label.sprite);
      this.labels.push(label);
    }
    const g = new BufferGeometry();
    g.setAttribute('position', new Float32BufferAttribute(pos, 3));
    g.setAttribute('color', new Float32BufferAttribute(col, 3));
    this.scene.add(new LineSegments(g, new LineBasicMaterial({ vertexColors: true, depthTest: false, depthWrite: false })));
  }

  /** Draws the triad into the upper right corner, turned as the main camera looks. */
  render(renderer: WebGLRenderer, main: Camera): void {
    this.camera.quaternion.copy(main.quaternion);
    this.back.set(0, 0, 5).applyQuaternion(main.quaternion);
    this.camera.position.copy(this.back);
    this.camera.up.copy(main.up);
    this.camera.updateMatrixWorld(true);
    // An axis pointing at the viewer or away is a dot: its label would cover the others'.
    this.back.normalize();
    this.labels.forEach((l, i) => {
      const d = AXES[i].dir;
      l.sprite.visible = Math.abs(d[0] * this.back.x + d[1] * this.back.y + d[2] * this.back.z) < 0.9;
    });
    const autoClear = renderer.autoClear;
    renderer.autoClear = false;
    const size = renderer.getSize(this.size);
    renderer.setViewport(size.x - TRIAD_PX - 6, size.y - TRIAD_PX - 6, TRIAD_PX, TRIAD_PX);
    renderer.render(this.scene, this.camera);
    renderer.setViewport(0, 0, size.x, size.y);
    renderer.autoClear = autoClear;
  }
}
