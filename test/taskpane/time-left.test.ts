import { durationText, timeLeftMs } from '../../src/taskpane/time-left';

describe('time left', () => {
  test('is the average pace times the steps left, capped by the budget', () => {
    // Source: arithmetic: 100 steps in 10 s is 0.1 s a step; 900 steps left take 90 s
    expect(timeLeftMs(100, 1000, 10_000)).toBe(90_000);
    expect(timeLeftMs(100, 1000, 10_000, 30_000)).toBe(20_000);
    expect(timeLeftMs(0, 1000, 10_000)).toBeNull();
    expect(timeLeftMs(5, 0, 10)).toBeNull();
  });

  test('durations read as seconds, minutes or hours', () => {
    expect(durationText(44_600)).toBe('45 s');
    expect(durationText(200_000)).toBe('3 min 20 s');
    expect(durationText(3_900_000)).toBe('1 h 5 min');
  });
});
