import * as assert from 'node:assert/strict';
import { LineTracker } from '../../extension/lineTracker.js';

describe('LineTracker', () => {
  it('maps every line to itself before any edit', () => {
    const t = new LineTracker();
    assert.equal(t.identity, true);
    assert.deepEqual([0, 5, 99].map((l) => t.map(l)), [0, 5, 99]);
  });

  it('shifts lines below an insertion of two lines and keeps lines above', () => {
    const t = new LineTracker();
    // Typing "a\nb\n" at the start of line 3: lines [3, 3] become three lines.
    t.apply(3, 3, 2);
    assert.deepEqual([0, 2, 4, 10].map((l) => t.map(l)), [0, 2, 6, 12]);
    assert.equal(t.map(3), undefined);
    assert.equal(t.unmap(6), 4);
    assert.equal(t.unmap(4), undefined);
  });

  it('keeps a line in place while the user types within it', () => {
    const t = new LineTracker();
    t.apply(7, 7, 0);
    assert.equal(t.map(7), 7);
    assert.equal(t.unmap(7), 7);
  });

  it('drops lines removed by a deletion and pulls later lines up', () => {
    const t = new LineTracker();
    // Lines 2..4 joined into one: two line breaks removed.
    t.apply(2, 4, 0);
    assert.deepEqual([1, 2, 3, 4, 5, 9].map((l) => t.map(l)), [1, undefined, undefined, undefined, 3, 7]);
    assert.equal(t.unmap(3), 5);
  });

  it('composes edits in the order they happened', () => {
    const t = new LineTracker();
    t.apply(0, 0, 1); // a line inserted at the top: old 5 → 6
    t.apply(10, 12, 0); // then lines 10..12 (new numbering) collapse: old 11 (now 12) is gone, old 12 (now 13) → 11
    assert.deepEqual([5, 9, 11, 12].map((l) => t.map(l)), [6, undefined, undefined, 11]);
    assert.equal(t.map(8), 9);
    assert.equal(t.unmap(11), 12);
  });
});
