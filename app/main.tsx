/** Mounts the editor: starts the engine's worker, then the React page. */
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { App } from './App.tsx';
import { setEngine } from './engine/instance.ts';
import { createWorkerEngine } from './engine/worker.ts';
import './style.css';

// Before the first render: the canvas, the tools and the panels all ask for it.
setEngine(createWorkerEngine());

// The end-to-end tests' hook, only when a test drives the page (navigator.webdriver) or
// the address asks for it; a separate chunk that normal use never loads.
if (navigator.webdriver || new URLSearchParams(location.search).has('test-hook')) {
  void import('./testHook.ts').then((m) => m.installTestHook());
}

const root = document.getElementById('root');
if (!root) throw new Error('index.html has no #root element');
createRoot(root).render(
  <StrictMode>
    <App />
  </StrictMode>,
);
