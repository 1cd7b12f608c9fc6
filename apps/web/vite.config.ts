import path from 'node:path';
import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import { build, defineConfig, type Plugin, type Rolldown } from 'vite';
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

/**
 * The scripts the Arch route's chunk needs that the entry does not already load, then their
 * stylesheets (paths from the site root). Vite's preload helper only asks for a lazy route's CSS
 * once the route's import runs, and waits for it before the route renders.
 */
function archChunks(bundle: Rolldown.OutputBundle, base: string): string[] {
  const chunks = Object.values(bundle).filter((file): file is Rolldown.OutputChunk => file.type === 'chunk');
  const byName = new Map(chunks.map((chunk) => [chunk.fileName, chunk]));
  const closure = (start: Rolldown.OutputChunk): Set<string> => {
    const seen = new Set<string>();
    const visit = (name: string) => {
      if (seen.has(name)) return;
      seen.add(name);
      for (const next of byName.get(name)?.imports ?? []) visit(next);
    };
    visit(start.fileName);
    return seen;
  };
  const entry = chunks.find((chunk) => chunk.isEntry);
  const arch = chunks.find((chunk) => chunk.facadeModuleId?.endsWith('/features/arch/routes/arch-route.tsx'));
  if (!entry || !arch) throw new Error('early reads: no entry chunk or no Arch route chunk in the build');
  const loaded = closure(entry);
  const scripts = [...closure(arch)].filter((name) => !loaded.has(name));
  const loadedCss = new Set([...loaded].flatMap((name) => [...(byName.get(name)?.viteMetadata?.importedCss ?? [])]));
  const stylesheets = new Set(
    scripts
      .flatMap((name) => [...(byName.get(name)?.viteMetadata?.importedCss ?? [])])
      .filter((css) => !loadedCss.has(css)),
  );
  return [...scripts, ...stylesheets].map((name) => `${base}${name}`);
}

/**
 * Puts src/lib/early-reads/inline.ts into index.html as an inline script, early in <head>: it
 * starts the session's and the Arch patient's reads and preloads the Arch route's chunks before
 * the main bundle has loaded (issue 13, goal 3). The API allows the script by its sha256, computed
 * from the index.html it serves (security-headers.ts), so a rebuilt web needs an API restart, as
 * any new build does. Build only: in `vite` (dev) the app reads as it starts.
 */
const earlyReads = (): Plugin => {
  let base = '/';
  return {
    name: 'torquetrail-early-reads',
    apply: 'build',
    configResolved(config) {
      base = config.base;
    },
    transformIndexHtml: {
      order: 'post',
      async handler(html, context) {
        if (!context.bundle) return html;
        const built = await build({
          configFile: false,
          logLevel: 'warn',
          publicDir: false,
          define: { TT_ARCH_CHUNKS: JSON.stringify(archChunks(context.bundle, base)) },
          build: {
            write: false,
            emptyOutDir: false,
            minify: true,
            lib: {
              entry: fileURLToPath(new URL('./src/lib/early-reads/inline.ts', import.meta.url)),
              formats: ['iife'],
              name: 'ttEarlyReadsScript',
            },
          },
        });
        const outputs = (Array.isArray(built) ? built : [built]) as Rolldown.RolldownOutput[];
        const code = outputs.flatMap((output) => output.output).find((file) => file.type === 'chunk')?.code;
        if (!code) throw new Error('early reads: the inline script did not build');
        // Right after the charset (which must come within the first 1024 bytes) and before the
        // stylesheet: an inline script after a stylesheet waits for it.
        const charset = '<meta charset="UTF-8" />';
        if (!html.includes(charset)) throw new Error(`early reads: index.html has no ${charset}`);
        // A function, so no `$` of the script is read as a replacement pattern.
        return html.replace(charset, () => `${charset}\n    <script>${code.trim()}</script>`);
      },
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
    replacedModules(),
    earlyReads(),
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
      // zod's schema builders (`z.enum(…)`, `z.object(…)`…) have no side effects, but the bundler
      // cannot tell, so it kept every schema the contracts define, used or not, and built them all as
      // the first load ran (e.g. the health reply's). Marked pure, a schema no web module uses is
      // dropped (issue 13, goal 3). Only calls through the name `z`: nothing of the sources calls it
      // for its effect (no registry, no `z.config`).
      treeshake: { manualPureFunctions: ['z'] },
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
