import { describe, expect, it } from 'vitest';
import { safeNextPath } from '@/features/auth/hooks/use-next-path.ts';
import { groupByRoom } from '@/features/cases/components/day-view.tsx';
import { buildCase, buildRoom } from './shell-factories.ts';

describe('where sign-in leads', () => {
  it.each([
    ['/cases/5a4b3c2d-1e0f-4a9b-8c7d-6e5f4a3b2c1d', '/cases/5a4b3c2d-1e0f-4a9b-8c7d-6e5f4a3b2c1d'],
    ['/cases?date=2025-03-14', '/cases?date=2025-03-14'],
    ['/invite/0b7e4c1a-2d3f-4a5b-8c6d-9e0f1a2b3c4d', '/invite/0b7e4c1a-2d3f-4a5b-8c6d-9e0f1a2b3c4d'],
  ])('back to the address asked for: %s', (next, expected) => {
    expect(safeNextPath(next)).toBe(expected);
  });

  // Open-redirect forms (OWASP Unvalidated Redirects and Forwards cheat sheet): another host, by any spelling.
  it.each([null, '', 'https://elsewhere.example/', '//elsewhere.example/path', '/\\elsewhere.example', 'cases', '/sign-in?next=/cases'])(
    'to the day list for %j',
    (next) => {
      expect(safeNextPath(next)).toBe('/cases');
    },
  );
});

describe('the day list', () => {
  const roomA = buildRoom({ id: '11111111-1111-4111-8111-111111111111', name: 'Room A' });
  const roomB = buildRoom({ id: '22222222-2222-4222-8222-222222222222', name: 'Room B' });
  const roomC = buildRoom({ id: '33333333-3333-4333-8333-333333333333', name: 'Room C' });

  it('shows every room in name order, each with its cases by planned time, and an empty room too', () => {
    const late = buildCase({ id: 'aaaaaaaa-aaaa-4aaa-8aaa-aaaaaaaaaaaa', room: roomA, scheduledAt: '2025-03-14T13:00:00.000Z' });
    const early = buildCase({ id: 'bbbbbbbb-bbbb-4bbb-8bbb-bbbbbbbbbbbb', room: roomA, scheduledAt: '2025-03-14T08:30:00.000Z' });
    const inC = buildCase({ id: 'cccccccc-cccc-4ccc-8ccc-cccccccccccc', room: roomC });
    const groups = groupByRoom([roomC, roomA, roomB], [late, inC, early]);
    expect(groups.map((g) => [g.room.name, g.cases.map((c) => c.id)])).toEqual([
      ['Room A', [early.id, late.id]],
      ['Room B', []],
      ['Room C', [inC.id]],
    ]);
  });

  it('orders rooms by the number in their name, so Room 10 comes after Room 9', () => {
    const rooms = ['Room 10', 'Room 9', 'Room 1'].map((name, i) => buildRoom({ id: `4444444${i}-4444-4444-8444-444444444444`, name }));
    expect(groupByRoom(rooms, []).map((g) => g.room.name)).toEqual(['Room 1', 'Room 9', 'Room 10']);
  });
});
