import { describe, expect, it } from 'vitest';
import { hiddenSides } from '../../src/ui/ScrollCue';

// The sideways-scroll cue (issue 9 item 7): which edges hide columns.
describe('hidden sides of a sideways-scrolling box', () => {
  it('a box as wide as its content hides nothing', () => {
    expect(hiddenSides(0, 400, 400)).toEqual({ left: false, right: false });
  });
  it('wider content hides columns on the right until scrolled to the end', () => {
    expect(hiddenSides(0, 400, 900)).toEqual({ left: false, right: true });
    expect(hiddenSides(250, 400, 900)).toEqual({ left: true, right: true });
    expect(hiddenSides(500, 400, 900)).toEqual({ left: true, right: false });
    // sub-pixel rounding at the end counts as the end
    expect(hiddenSides(499.5, 400, 900)).toEqual({ left: true, right: false });
  });
});
