// The inline script of index.html (vite.config.ts builds this file, with start.ts, into the page
// and fills in the Arch route's chunks). The API allows it by its hash (Content-Security-Policy,
// apps/api/src/http-security/security-headers.ts), computed from the index.html it serves.
import { startEarlyReads } from './start';

declare const TT_ARCH_CHUNKS: readonly string[];

startEarlyReads(window, TT_ARCH_CHUNKS);
