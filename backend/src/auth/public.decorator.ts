import { SetMetadata } from '@nestjs/common';

export const IS_PUBLIC = 'quietglass:public';
export const ALLOWED_BEFORE_PASSWORD_CHANGE = 'quietglass:before-password-change';

/** Marks a route that needs no signed-in user. Every other route does. */
export const Public = () => SetMetadata(IS_PUBLIC, true);

/** Marks a route a user may call while they still must replace an admin-set password. */
export const AllowedBeforePasswordChange = () => SetMetadata(ALLOWED_BEFORE_PASSWORD_CHANGE, true);
