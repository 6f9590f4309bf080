import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { RouterProvider } from 'react-router-dom';
import { ThemeAndDataProvider } from './app/provider';
import { createRouter } from './app/router';
import './app/fonts.css';
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
