// Placeholder entry so the renderer build can be tested; the real app replaces it.
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';

const container = document.getElementById('root');
if (container === null) throw new Error('renderer/index.html lacks #root');

createRoot(container).render(
  <StrictMode>
    <h1>Tiltbench</h1>
  </StrictMode>,
);
