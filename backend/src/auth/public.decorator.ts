import { applyDecorators, SetMetadata } from '@nestjs/common';

export const IS_PUBLIC = 'quietglass:public';
export const ALLOWED_BEFORE_PASSWORD_CHANGE = 'quietglass:before-password-change';

/** Marks a route that needs no signed-in user. Every other route does. */
export const Public = () => SetMetadata(IS_PUBLIC, true);

/** Marks a route a user may call while they still must replace an admin-set password. */
export const AllowedBeforePasswordChange = () => SetMetadata(ALLOWED_BEFORE_PASSWORD_CHANGE, true);

export const OPTIONAL_SESSION = 'quietglass:optional-session';

/**
 * A public route that still learns who is signed in, when anyone is: the session is checked as on
 * any route, but a missing or ended one is not an error (the route sees no user).
 */
export const OptionalSession = () =>
  applyDecorators(SetMetadata(IS_PUBLIC, true), SetMetadata(OPTIONAL_SESSION, true));
