import { describe, expect, it } from 'vitest';
import { auditQuerySchema } from './audit.js';
import { problems } from './__tests__/problems.js';

const auditProblems = (query: Record<string, unknown>) => problems(auditQuerySchema, query);

describe('audit trail query', () => {
  it('reads ids from the text of a query string', () => {
    expect(
      auditQuerySchema.parse({ entity: 'design', entityId: '30', actorId: '3', from: '2026-12-01' }),
    ).toEqual({ entity: 'design', entityId: 30, actorId: 3, from: '2026-12-01' });
    expect(auditQuerySchema.parse({})).toEqual({});
  });

  it.each([
    [{ entity: 'spaceship' }, /^entity: entity must be one of user, material, /],
    [{ entityId: 'x' }, /^entityId: entityId must be a record id$/],
    [{ entityId: '0' }, /^entityId: entityId must be a record id$/],
    [{ designId: '2.5' }, /^designId: designId must be a design id$/],
    [{ actorId: ['3', '4'] }, /^actorId: actorId must be a user id$/],
    [{ from: '2026-13-01' }, /^from: from must be a date \(YYYY-MM-DD\)$/],
    [{ to: '1 Dec 2026' }, /^to: to must be a date \(YYYY-MM-DD\)$/],
    [{ designId: '4', entity: 'quote' }, /^designId: Use either designId or entity, not both$/],
    [
      { from: '2026-12-05', to: '2026-12-04' },
      /^to: The last day must not be before the first \(2026-12-05\)$/,
    ],
    [{ page: '2' }, /^Unrecognized key: "page"$/],
  ])('refuses %j', (query, expected) => {
    const lines = auditProblems(query);
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(expected);
  });

  it('takes designId with entity=design', () => {
    expect(auditProblems({ designId: '4', entity: 'design' })).toEqual([]);
  });
});
