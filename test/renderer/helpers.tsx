// Shared set-up of the renderer's component tests: a workbench on a demo design.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { ReactNode } from 'react';
import { parseDesignText } from '../../core/design/validateDesign';
import type { DesignFile } from '../../core/design/types';
import { WorkbenchProvider } from '../../renderer/app/workbenchContext';
import { designToText } from '../../renderer/model/designText';
import { createWorkbench, type Workbench } from '../../renderer/state/workbench';

export function demoDesign(name = 'heron-tilting-velomobile'): DesignFile {
  // The test runner's working directory is the repository root.
  const text = readFileSync(path.join(process.cwd(), 'assets', 'designs', `${name}.tiltsheet`), 'utf8');
  const parsed = parseDesignText(text, `${name}.tiltsheet`);
  if (!parsed.ok) throw new Error(parsed.issues.map((i) => i.message).join('\n'));
  return parsed.design;
}

export function demoWorkbench(name?: string): Workbench {
  const design = demoDesign(name);
  return createWorkbench(design, { fileName: `${name ?? 'heron-tilting-velomobile'}.tiltsheet`, filePath: null, savedText: designToText(design) });
}

export function withWorkbench(wb: Workbench, children: ReactNode) {
  return <WorkbenchProvider workbench={wb}>{children}</WorkbenchProvider>;
}
