import { bidsLabels } from './bids-layout';

// BIDS specification, Common principles, "Entities": a label is alphanumeric; "Case collision
// intolerance": labels must not collide when case is ignored.
describe('bidsLabels', () => {
  it('drops the characters a label may not hold', () => {
    expect(bidsLabels(['AC-0042', 'Month 6', 'V1'], 'x')).toEqual(['AC0042', 'Month6', 'V1']);
  });

  it('keeps labels unique when case is ignored, first come first kept, deterministically', () => {
    const texts = ['AB-12', 'A-B12', 'ab12', 'AB12n2'];
    const labels = bidsLabels(texts, 'x');
    expect(labels).toEqual(['AB12', 'AB12n3', 'ab12n4', 'AB12n2']);
    expect(new Set(labels.map((l) => l.toLowerCase())).size).toBe(texts.length);
    for (const label of labels) expect(label).toMatch(/^[A-Za-z0-9]+$/);
    expect(bidsLabels(texts, 'x')).toEqual(labels);
  });

  it('falls back when nothing alphanumeric is left', () => {
    expect(bidsLabels(['—', '(visit)', '?'], 'visit')).toEqual(['visit', 'visitn2', 'visitn3']);
  });
});
