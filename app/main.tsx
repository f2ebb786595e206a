/** Mounts the page. The editor proper comes later; for now the page shows the demo inscription. */
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { DemoView } from './DemoView.tsx';
import './style.css';

const root = document.getElementById('root');
if (!root) throw new Error('index.html has no #root element');
createRoot(root).render(
  <StrictMode>
    <DemoView />
  </StrictMode>,
);
