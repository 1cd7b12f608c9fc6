// What the app layer uses from the auth feature (the sign-in page itself is routed directly).
export { authKeys, isMeQueryKey } from './api/keys';
export { prefetchMe, useMe } from './api/get-me';
export { useSignOut } from './api/sign-out';
