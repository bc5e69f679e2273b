/**
 * Keeps the rest of the workbench working when the 3D view cannot (no WebGL, a lost context):
 * the readouts, tables, charts and files do not need it.
 */
import { Component, type ErrorInfo, type ReactNode } from 'react';

interface State {
  error: string | null;
}

export class ViewportBoundary extends Component<{ children: ReactNode }, State> {
  override state: State = { error: null };

  static getDerivedStateFromError(error: unknown): State {
    return { error: error instanceof Error ? error.message : String(error) };
  }

  override componentDidCatch(error: unknown, info: ErrorInfo): void {
    console.warn('3D view stopped:', error, info.componentStack);
  }

  override render(): ReactNode {
    if (this.state.error === null) return this.props.children;
    return (
      <div className="viewport-failed" role="alert" data-testid="viewport-failed">
        <strong>The 3D view could not start.</strong>
        <span>{this.state.error}</span>
        <span>
          Everything else works: the readings, alerts, hardpoints, charts and files. On a machine without a GPU the view needs WebGL on
          SwiftShader (Chromium and Electron switch: --enable-unsafe-swiftshader).
        </span>
        <button type="button" onClick={() => this.setState({ error: null })}>
          Try again
        </button>
      </div>
    );
  }
}
