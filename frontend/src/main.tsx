import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { RouterProvider } from 'react-router-dom';
import { ThemeAndDataProvider } from './app/provider';
import { createRouter } from './app/router';
// IBM Plex (SIL Open Font License 1.1) from @fontsource: Vite bundles the files, so nothing is
// fetched from another origin; each subset downloads only when a page uses its characters.
import '@fontsource/ibm-plex-sans/400.css';
import '@fontsource/ibm-plex-sans/400-italic.css';
import '@fontsource/ibm-plex-sans/500.css';
import '@fontsource/ibm-plex-sans/600.css';
import '@fontsource/ibm-plex-mono/400.css';
import '@fontsource/ibm-plex-mono/500.css';
import './app/global.css';

const root = document.getElementById('root');
if (root === null) throw new Error('Gyre: #root element missing from index.html');

createRoot(root).render(
  <StrictMode>
    <ThemeAndDataProvider>
      <RouterProvider router={createRouter()} />
    </ThemeAndDataProvider>
  </StrictMode>,
);
