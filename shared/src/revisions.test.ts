import { describe, expect, it } from 'vitest';
import { nextRevision } from './revisions.js';

// Drawing revisions count on by letter or number: common drawing practice (no source).
describe('nextRevision', () => {
  it('counts letters on, carrying past Z', () => {
    expect(nextRevision('A')).toBe('B');
    expect(nextRevision('Y')).toBe('Z');
    expect(nextRevision('Z')).toBe('AA');
    expect(nextRevision('AZ')).toBe('BA');
    expect(nextRevision('c')).toBe('d');
  });
  it('counts trailing numbers on', () => {
    expect(nextRevision('3')).toBe('4');
    expect(nextRevision('B2')).toBe('B3');
    expect(nextRevision('1.9')).toBe('1.10');
  });
  it('appends -2 to anything else', () => {
    expect(nextRevision('draft-')).toBe('draft--2');
  });
});
