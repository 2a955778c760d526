import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
// Fonts ship with the build; nothing is fetched from elsewhere.
import '@fontsource/inter/400.css';
import '@fontsource/inter/500.css';
import '@fontsource/inter/600.css';
import '@fontsource/inter/700.css';
import '@fontsource/roboto-mono/400.css';
import '@fontsource/roboto-mono/500.css';
import './styles/index.css';
import { AppProvider } from './app/provider';

const root = document.getElementById('root');
if (!root) throw new Error('index.html has no #root element');
createRoot(root).render(
  <StrictMode>
    <AppProvider />
  </StrictMode>,
);
