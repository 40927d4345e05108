// Which current each record takes (docs/domain.md#tide): a dataset speed wins where it has a value
// (with its own direction, unknown without a direction column); elsewhere the predicted tidal
// current; neither gives no current at all. Expected values are written out by hand per case.
import { describe, expect, it } from 'vitest';
import { CURRENT_SOURCES, combineCurrent } from '../../shared/seadata/water-level';

const f = (a: number[]) => Float64Array.from(a);
const predicted = { speedMps: f([0.5, 0.6, 0.7]), dirDeg: f([37, 37, 217]) };

describe('combineCurrent', () => {
  it.each([
    {
      name: 'prediction only',
      dataset: null,
      speed: [0.5, 0.6, 0.7],
      dir: [37, 37, 217],
      source: ['predicted', 'predicted', 'predicted'],
    },
    {
      name: 'dataset with gaps, with directions',
      dataset: { speedMps: f([0.1, NaN, 0.3]), dirDeg: f([90, NaN, 180]) },
      speed: [0.1, 0.6, 0.3],
      dir: [90, 37, 180],
      source: ['dataset', 'predicted', 'dataset'],
    },
    {
      name: 'dataset without a direction column',
      dataset: { speedMps: f([0.2, NaN, NaN]), dirDeg: null },
      speed: [0.2, 0.6, 0.7],
      dir: [NaN, 37, 217],
      source: ['dataset', 'predicted', 'predicted'],
    },
  ])('$name', ({ dataset, speed, dir, source }) => {
    const c = combineCurrent(predicted, dataset)!;
    expect(Array.from(c.speedMps)).toEqual(speed);
    expect(Array.from(c.dirDeg)).toEqual(dir);
    expect(Array.from(c.source, (k) => CURRENT_SOURCES[k])).toEqual(source);
  });

  it('leaves a dataset gap unknown without a prediction, and gives nothing without either', () => {
    const c = combineCurrent(null, { speedMps: f([0.4, NaN]), dirDeg: f([10, 20]) })!;
    expect(Array.from(c.speedMps)).toEqual([0.4, NaN]);
    expect(Array.from(c.source, (k) => CURRENT_SOURCES[k])).toEqual(['dataset', 'none']);
    expect(combineCurrent(null, null)).toBeNull();
    expect(() => combineCurrent(predicted, { speedMps: f([1]), dirDeg: null })).toThrow(RangeError);
  });
});
