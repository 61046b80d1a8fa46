// Runs sandboxed beside the window: it hands the page exactly the host API and nothing else.
import { contextBridge, ipcRenderer } from 'electron';
import { buildPreloadApi } from './preload-api.js';

contextBridge.exposeInMainWorld(
  'zvetHost',
  buildPreloadApi((channel, request) => ipcRenderer.invoke(channel, request)),
);
