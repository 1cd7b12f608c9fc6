import path from 'node:path';
import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import { defineConfig, type Plugin } from 'vite';
import { compression } from 'vite-plugin-compression2';

/** The shared packages are consumed from source, so the web needs no prior package build. */
const packageSource = (name: string): string =>
  fileURLToPath(new URL(`../../packages/${name}/src/index.ts`, import.meta.url));

/**
 * Modules of dependencies the web's build replaces with its own, smaller ones, each for code the
 * first load of every page carried and the web never runs (issue 13, goal 3). Keyed by the module's
 * path under node_modules, without its extension; matched on relative imports inside the package.
 * Build only: `vite` (dev) pre-bundles dependencies, and there the originals do no harm.
 * - Blueprint's icon loader refuses names missing from its `iconNames` module, a map of all ~700
 *   names built from an enum of every name (~9 kB gzip with its case converters); the app's own
 *   list replaces it (src/lib/icon-names-accepted.ts, kept exact by its test).
 * - zod's classic schemas import its JSON Schema writer (two modules), which only the API uses;
 *   src/lib/bundle/zod-json-schema-off.ts has the same names and throws if ever called.
 */
const REPLACED_MODULES: Readonly<Record<string, string>> = {
  '@blueprintjs/icons/lib/esm/iconNames': './src/lib/icon-names-accepted.ts',
  'zod/v4/core/to-json-schema': './src/lib/bundle/zod-json-schema-off.ts',
  'zod/v4/core/json-schema-processors': './src/lib/bundle/zod-json-schema-off.ts',
};

const replacedModules = (): Plugin => ({
  name: 'torquetrail-replaced-modules',
  apply: 'build',
  enforce: 'pre',
  resolveId(source, importer) {
    if (!importer || !source.startsWith('.') || !importer.includes('node_modules')) return null;
    const target = path.resolve(path.dirname(importer), source).replace(/\\/g, '/').replace(/\.js$/, '');
    const key = target.slice(target.lastIndexOf('node_modules/') + 'node_modules/'.length);
    const replacement = REPLACED_MODULES[key];
    return replacement ? fileURLToPath(new URL(replacement, import.meta.url)) : null;
  },
});

const apiPort = process.env.API_PORT ?? process.env.PORT ?? '3000';
const apiProxy = { '/api': { target: `http://127.0.0.1:${apiPort}` } };

export default defineConfig({
  // Every built file also as .gz and .br when that is smaller (the plugin skips the others), made
  // once here: the API serves them to browsers that accept them (express-static-gzip) instead of
  // compressing on each request. Small files too: a first load is many chunks under 1 KB.
  plugins: [
    replacedModules(),
    react(),
    compression({ algorithms: ['gzip', 'brotliCompress'], threshold: 0, skipIfLargerOrEqual: true }),
  ],
  resolve: {
    alias: {
      '@torquetrail/contracts': packageSource('contracts'),
      '@torquetrail/authz': packageSource('authz'),
      '@torquetrail/domain': packageSource('domain'),
    },
  },
  server: { host: '127.0.0.1', proxy: apiProxy },
  preview: { host: '127.0.0.1', proxy: apiProxy },
  build: {
    outDir: 'dist',
    emptyOutDir: true,
    rolldownOptions: {
      output: {
        // React is one long-lived vendor chunk, cached across releases of the app's own code, and
        // every page needs all of it. Blueprint is not grouped: one group would put every component
        // any page uses (popovers, sliders, numeric inputs…) into the first load; left to the
        // bundler its modules follow the pages that use them (issue 13, goal 3).
        codeSplitting: {
          groups: [{ name: 'vendor-react', test: /node_modules[\\/](react|react-dom|scheduler)[\\/]/ }],
        },
      },
    },
  },
});
