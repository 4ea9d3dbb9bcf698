import { describe, expect, it } from 'vitest';
import { dueReminderTime } from '../../../src/lib/programme';

describe('the reminder the open app shows (hand-worked)', () => {
  const fixtures = [
    { input: { times: ['09:00', '18:00'], now: '08:59', left: 2 }, expected: null, source: 'before the first time' },
    { input: { times: ['09:00', '18:00'], now: '09:00', left: 2 }, expected: '09:00', source: 'at the time' },
    { input: { times: ['18:00', '09:00'], now: '19:30', left: 1 }, expected: '18:00', source: 'latest passed, any order' },
    { input: { times: ['09:00', '18:00'], now: '19:30', left: 0 }, expected: null, source: 'everything ticked: nothing due' },
    { input: { times: ['9:00', '25:00'], now: '23:00', left: 3 }, expected: null, source: 'malformed times ignored' },
  ];
  it.each(fixtures)('$source', ({ input, expected }) => {
    expect(dueReminderTime(input.times, input.now, input.left)).toBe(expected);
  });
});
