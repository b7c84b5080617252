import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
// Barlow, shipped with the app (latin subsets; the browser fetches a weight when it is used).
import '@fontsource/barlow/400.css';
import '@fontsource/barlow/500.css';
import '@fontsource/barlow/600.css';
import '@fontsource/barlow/700.css';
import './index.css';
import { App } from './app/App';

const root = document.getElementById('root');
if (!root) throw new Error('index.html has no #root element');
createRoot(root).render(
  <StrictMode>
    <App />
  </StrictMode>,
);
