/**
 * A short text drawn into a canvas texture on a sprite (it faces the camera in every view).
 * Redrawn only when its text changes. Where no 2D canvas exists (jsdom) the sprite stays blank.
 */
import { CanvasTexture, LinearFilter, SRGBColorSpace, Sprite, SpriteMaterial } from 'three';

export interface TextStyle {
  colour: string;
  /** Backdrop behind the text, or null for none. */
  backdrop: string | null;
  /** Height of the sprite in world units (mm; the triad's units in its own scene). */
  height: number;
  bold?: boolean;
}

const PX = 48;

export class TextLabel {
  readonly sprite: Sprite;
  private readonly canvas: HTMLCanvasElement | null;
  private readonly texture: CanvasTexture | null;
  private text = '';

  constructor(
    text: string,
    private readonly style: TextStyle,
  ) {
    this.canvas = typeof document === 'undefined' ? null : document.createElement('canvas');
    const ctx = this.canvas?.getContext?.('2d') ?? null;
    this.texture = ctx && this.canvas ? new CanvasTexture(this.canvas) : null;
    if (this.texture) {
      this.texture.colorSpace = SRGBColorSpace;
      this.texture.minFilter = LinearFilter;
      this.texture.generateMipmaps = false;
    }
    const mat = new SpriteMaterial({ map: this.texture, transparent: true, depthTest: false, depthWrite: false });
    this.sprite = new Sprite(mat);
    this.sprite.renderOrder = 10;
    this.sprite.raycast = () => {};
    this.set(text);
  }

  /** The text shown (a no-op when unchanged). */
  set(text: string): void {
    if (text === this.text) return;
    this.text = text;
    const c = this.canvas;
    const ctx = c?.getContext?.('2d') ?? null;
    if (!c || !ctx || !this.texture) return;
    const font = `${this.style.bold ? '600 ' : ''}${PX}px system-ui, sans-serif`;
    ctx.font = font;
    const w = Math.ceil(ctx.measureText(text).width) + PX * 0.6;
    const h = Math.ceil(PX * 1.35);
    c.width = w;
    c.height = h;
    ctx.font = font;
    ctx.clearRect(0, 0, w, h);
    if (this.style.backdrop) {
      ctx.fillStyle = this.style.backdrop;
      ctx.beginPath();
      ctx.roundRect?.(0, 0, w, h, h * 0.25);
      ctx.fill();
    }
    ctx.fillStyle = this.style.colour;
    ctx.textAlign = 'center';
    ctx.textBaseline = 'middle';
    ctx.fillText(text, w / 2, h / 2 + 1);
    this.texture.needsUpdate = true;
    this.sprite.scale.set((this.style.height * w) / h, this.style.height, 1);
  }

  dispose(): void {
    this.texture?.dispose();
    this.sprite.material.dispose();
  }
}
