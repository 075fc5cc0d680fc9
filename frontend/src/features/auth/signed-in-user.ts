import { createContext, useContext } from 'react';
import type { UserView } from '@quietglass/shared';

/** The user of the current session, provided by RequireAuth to everything behind sign-in. */
export const SignedInUserContext = createContext<UserView | null>(null);

export function useSignedInUser(): UserView {
  const user = useContext(SignedInUserContext);
  if (!user) throw new Error('useSignedInUser is only usable inside RequireAuth.');
  return user;
}
