import { cleanup, configure } from '@testing-library/react';
import { afterEach } from 'vitest';
import { clearNotices } from '../lib/notifier';

// The data grid can take seconds to render its rows on a busy 2-core machine: wait up to 20 s for
// findBy* and waitFor instead of the default 1 s (the assertions themselves are unchanged).
configure({ asyncUtilTimeout: 20_000 });

afterEach(() => {
  cleanup();
  clearNotices();
});
