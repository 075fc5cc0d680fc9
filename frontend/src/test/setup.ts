import { cleanup } from '@testing-library/react';
import { afterEach } from 'vitest';
import { clearNotices } from '../lib/notifier';

afterEach(() => {
  cleanup();
  clearNotices();
});
