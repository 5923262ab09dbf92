// First: configures zod before any schema is built (see the module).
import './zod-config';
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import './styles/app.css';
import { AppProvider } from './app/provider';

const root = document.getElementById('root');
if (!root) throw new Error('index.html has no #root element');

createRoot(root).render(
  <StrictMode>
    <AppProvider />
  </StrictMode>,
);
