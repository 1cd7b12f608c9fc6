import '@fontsource/noto-sans/400.css';
import '@fontsource/noto-sans/600.css';
import '@fontsource/noto-sans/700.css';
import '@blueprintjs/core/lib/css/blueprint.css';
import './app/theme.css';
import './app/shell.css';

import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { RouterProvider } from 'react-router-dom';
import { Providers } from './app/providers';
import { createQueryClient } from './app/query-client';
import { createRouter } from './app/router';
import { loadIconsOneByOne } from './lib/icon-loader';

const container = document.getElementById('root');
if (!container) throw new Error('index.html has no #root element');

loadIconsOneByOne();

// One query cache for the router's loaders (which start the first reads) and the pages.
const queryClient = createQueryClient();
const router = createRouter(queryClient);

createRoot(container).render(
  <StrictMode>
    <Providers client={queryClient}>
      <RouterProvider router={router} />
    </Providers>
  </StrictMode>,
);
