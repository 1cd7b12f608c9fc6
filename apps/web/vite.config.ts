import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import { defineConfig, type Plugin } from 'vite';
import { compression } from 'vite-plugin-compression2';

/** The shared packages are consumed from source, so the web needs no prior package build. */
const packageSource = (name: string): string =>
  fileURLToPath(new URL(`../../packages/${name}/src/index.ts`, import.meta.url));

/**
 * Blueprint's icon loader refuses names missing from its `iconNames` module, which builds a map of
 * every icon name (~9 kB gzip with its case converters) into the first load of every page. The
 * build gives it the app's own list instead (src/lib/icon-names-accepted.ts). Build only: `vite`
 * (dev) pre-bundles Blueprint, and there the full list does no harm.
 */
const acceptedIconNames = (): Plugin => {
  const replacement = fileURLToPath(new URL('./src/lib/icon-names-accepted.ts', import.meta.url));
  return {
    name: 'torquetrail-accepted-icon-names',
    apply: 'build',
    enforce: 'pre',
    resolveId(source, importer) {
      if (importer && /[\\/]@blueprintjs[\\/]icons[\\/]lib[\\/]esm[\\/]/.test(importer) && /^\.\/iconNames(\.js)?$/.test(source)) {
        return replacement;
      }
      return null;
    },
  };
};

const apiPort = process.env.API_PORT ?? process.env.PORT ?? '3000';
const apiProxy = { '/api': { target: `http://127.0.0.1:${apiPort}` } };

export default defineConfig({
  // Every built file also as .gz and .br when that is smaller (the plugin skips the others), made
  // once here: the API serves them to browsers that accept them (express-static-gzip) instead of
  // compressing on each request. Small files too: a first load is many chunks under 1 KB.
  plugins: [
    acceptedIconNames(),
    react(),
    compression({ algorithms: ['gzip', 'brotliCompress'], threshold: 0, skipIfLargerOrEqual: true })],
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
