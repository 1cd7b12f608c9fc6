// Architecture boundaries, checked in `npm run lint` (see docs/adr/0005-checked-boundaries.md).
// Paths are relative to the repository root. Each rule says why it exists.
/** @type {import('dependency-cruiser').IConfiguration} */
module.exports = {
  forbidden: [
    {
      name: 'no-cycles',
      comment: 'A cycle makes two modules one: neither can be understood, tested or moved alone.',
      severity: 'error',
      from: {},
      to: { circular: true },
    },
    {
      name: 'packages-never-import-apps',
      comment: 'packages/* are shared by both apps; an import into an app would turn the layering upside down.',
      severity: 'error',
      from: { path: '^packages/' },
      to: { path: '^apps/' },
    },
    {
      name: 'domain-is-pure',
      comment:
        'packages/domain is pure clinical computation: no I/O, no other workspace, no runtime dependency. Its tests may use reference libraries.',
      severity: 'error',
      from: { path: '^packages/domain/src/', pathNot: '\\.test\\.ts$' },
      to: { pathNot: '^packages/domain/src/' },
    },
    {
      name: 'web-features-through-their-index',
      comment:
        "A web feature uses another feature only through that feature's public index.ts (or is composed in app/); its insides can change freely.",
      severity: 'error',
      from: { path: '^apps/web/src/features/([^/]+)/' },
      to: {
        path: '^apps/web/src/features/([^/]+)/',
        pathNot: ['^apps/web/src/features/$1/', '^apps/web/src/features/[^/]+/index\\.tsx?$'],
      },
    },
    {
      name: 'web-lib-below-features',
      comment: 'lib/ is shared by every feature; it must not depend on any of them.',
      severity: 'error',
      from: { path: '^apps/web/src/lib/' },
      to: { path: '^apps/web/src/(features|app)/' },
    },
    {
      name: 'web-features-below-app',
      comment: 'app/ composes features (router, shell); features never reach up into it.',
      severity: 'error',
      from: { path: '^apps/web/src/features/' },
      to: { path: '^apps/web/src/app/' },
    },
    {
      name: 'api-repository-private-to-its-feature',
      comment:
        "A repository is its feature's SQL. Shared scoping lives in authz/, shared helpers in common/ or db/; another feature asks through a service.",
      severity: 'error',
      from: { path: '^apps/api/src/([^/]+)/' },
      to: { path: '^apps/api/src/([^/]+)/[^/]+\\.repository\\.ts$', pathNot: '^apps/api/src/$1/' },
    },
    {
      name: 'api-sql-only-in-repositories',
      comment:
        'Services own rules and transactions; SQL (drizzle query builders and table objects) is written only in repositories and db/.',
      severity: 'error',
      from: { path: '^apps/api/src/[^/]+/[^/]+\\.(service|controller)\\.ts$' },
      to: { path: ['^apps/api/src/db/schema/', 'node_modules/drizzle-orm/'] },
    },
    {
      name: 'no-unresolvable',
      comment: 'An import that does not resolve is a typo or a missing dependency.',
      severity: 'error',
      from: {},
      to: { couldNotResolve: true },
    },
    {
      name: 'api-tests-not-imported-by-app',
      comment: 'Product code never depends on test support.',
      severity: 'error',
      from: { path: '^apps/(api|web)/src/', pathNot: '\\.(spec|test)\\.tsx?$' },
      to: { path: ['^apps/api/test/', '^apps/web/e2e/'] },
    },
  ],
  options: {
    doNotFollow: { path: 'node_modules' },
    exclude: { path: ['(^|/)dist/', '^\\.local/', '(^|/)node_modules/\\.vite'] },
    tsPreCompilationDeps: true,
    tsConfig: { fileName: 'tsconfig.depcruise.json' },
    enhancedResolveOptions: {
      exportsFields: ['exports'],
      conditionNames: ['import', 'require', 'node', 'default', 'types'],
      extensions: ['.ts', '.tsx', '.js', '.mjs', '.json'],
    },
    reporterOptions: { text: { highlightFocused: true } },
  },
};
