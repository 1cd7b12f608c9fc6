import { SetMetadata } from '@nestjs/common';

export const IS_PUBLIC = 'torquetrail:isPublic';

/** Opens a route to callers who are not signed in (sign-in, health). Everything else is closed. */
export const Public = () => SetMetadata(IS_PUBLIC, true);
