import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { z } from 'zod';
import './styles/app.css';
import { AppProvider } from './app/provider';

// zod 4 probes `new Function` for its JIT; the page's CSP has no 'unsafe-eval', so parse without it.
z.config({ jitless: true });

const root = document.getElementById('root');
if (!root) throw new Error('index.html has no #root element');

createRoot(root).render(
  <StrictMode>
    <AppProvider />
  </StrictMode>,
);
