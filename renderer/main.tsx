// Entry of the workbench's renderer: pick the file service (Electron or browser), create the
// workbench on the bundled demo, then let the document flow load what start-up asks for.
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { parseDesignText } from '../core/design/validateDesign';
import { App } from './app/App';
import { FlowProvider } from './app/flowContext';
import { WorkbenchProvider } from './app/workbenchContext';
import { DocumentFlow } from './files/documentFlow';
import { indexedDbRecovery } from './files/durableRecovery';
import { browserFileService, electronFileService, type FileService } from './files/fileService';
import { DEFAULT_DEMO } from './model/demoDesigns';
import { designToText } from './model/designText';
import { createWorkbench } from './state/workbench';
import { PlaybackController } from './panels/playback';
import { renderStats } from './viewport/viewSignals';
import './styles.css';

const container = document.getElementById('root');
if (container === null) throw new Error('renderer/index.html lacks #root');

const parsed = parseDesignText(DEFAULT_DEMO.text, DEFAULT_DEMO.fileName);
if (!parsed.ok) throw new Error(`bundled demo is invalid: ${parsed.issues.map((i) => i.message).join('; ')}`);
const workbench = createWorkbench(parsed.design, { fileName: DEFAULT_DEMO.fileName, filePath: null, savedText: designToText(parsed.design) });

/** The browser fallback's hidden file input; a file put into it directly is opened too. */
function browserFiles(): FileService {
  const input = document.createElement('input');
  input.type = 'file';
  input.accept = '.tiltsheet,application/json';
  input.hidden = true;
  input.dataset.testid = 'open-file-input';
  document.body.appendChild(input);
  let pending: ((f: File | null) => void) | null = null;
  input.addEventListener('change', () => {
    const file = input.files?.[0] ?? null;
    input.value = '';
    if (pending) {
      const p = pending;
      pending = null;
      p(file);
    } else if (file) {
      void file.text().then((text) => flow.loadText({ fileName: file.name, path: null, text }));
    }
  });
  input.addEventListener('cancel', () => {
    const p = pending;
    pending = null;
    p?.(null);
  });
  return browserFileService({
    pickFile: () =>
      new Promise((resolve) => {
        pending?.(null);
        pending = resolve;
        input.click();
      }),
    download(text, fileName) {
      const url = URL.createObjectURL(new Blob([text], { type: 'application/json' }));
      const a = document.createElement('a');
      a.href = url;
      a.download = fileName;
      document.body.appendChild(a);
      a.click();
      a.remove();
      setTimeout(() => URL.revokeObjectURL(url), 30_000);
    },
    location: window.location,
    storage: window.localStorage,
    fetch: window.fetch.bind(window),
    ...(window.indexedDB ? { durable: indexedDbRecovery(window.indexedDB) } : {}),
  });
}

const files = window.tiltbench ? electronFileService(window.tiltbench) : browserFiles();
const flow = new DocumentFlow(workbench, files);
const playback = new PlaybackController(workbench);

// Test and benchmark hooks: the stores (document, pose, ui, jobs), the actions, the document
// flow, playback and the render counters.
Object.assign(window, { __tiltbench: { ...workbench, flow, playback }, __tiltbenchStats: renderStats });

createRoot(container).render(
  <StrictMode>
    <WorkbenchProvider workbench={workbench}>
      <FlowProvider flow={flow}>
        <App playback={playback} />
      </FlowProvider>
    </WorkbenchProvider>
  </StrictMode>,
);

void flow.start();
