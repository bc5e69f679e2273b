/**
 * Sandboxed preload: exposes `window.tiltbench`, one function per IPC message. The raw
 * `ipcRenderer` never reaches the page. Bundled to dist-electron/preload.cjs.
 */
import { contextBridge, ipcRenderer } from 'electron';
import { IPC, type TiltbenchApi } from './api';

const api: TiltbenchApi = {
  openDesign: () => ipcRenderer.invoke(IPC.designOpen),
  initialDesign: () => ipcRenderer.invoke(IPC.designInitial),
  saveDesign: (path, text) => ipcRenderer.invoke(IPC.designSave, { path, text }),
  saveDesignAs: (text, suggestedName) =>
    ipcRenderer.invoke(IPC.designSaveAs, suggestedName === undefined ? { text } : { text, suggestedName }),
  writeRecovery: (text) => ipcRenderer.invoke(IPC.recoveryWrite, text),
  readRecovery: () => ipcRenderer.invoke(IPC.recoveryRead),
  clearRecovery: () => ipcRenderer.invoke(IPC.recoveryClear),
  recentDesigns: () => ipcRenderer.invoke(IPC.appRecent),
  openRecentDesign: (path: string) => ipcRenderer.invoke(IPC.designOpenRecent, path),
  nextOpenRequest: () => ipcRenderer.invoke(IPC.designOpenRequest),
  saveReportPdf: (html, suggestedName) => ipcRenderer.invoke(IPC.reportPdf, suggestedName === undefined ? { html } : { html, suggestedName }),
};

contextBridge.exposeInMainWorld('tiltbench', Object.freeze(api));
