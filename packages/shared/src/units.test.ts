import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import {
  convertArea,
  convertLength,
  METRES_PER_US_SURVEY_FOOT,
  ROAD_STRIP_DIVISOR,
  roadStripAcres,
  type AreaUnit,
} from './units.js';

describe('length definitions', () => {
  it('defines the foot as exactly 0.3048 m (NIST/NOAA, Federal Register 85 FR 62698, 2020)', () => {
    expect(convertLength(1, 'foot', 'metre').toString()).toBe('0.3048');
  });

  it('defines the US survey foot as 1200/3937 m (85 FR 62698, 2020)', () => {
    expect(METRES_PER_US_SURVEY_FOOT.times(3937).toString()).toBe('1200');
    expect(convertLength(3937, 'us-survey-foot', 'metre').toFixed(12)).toBe('1200.000000000000');
  });

  it('makes the survey foot 2 ppm longer than the international foot (85 FR 62698, 2020)', () => {
    const ratio = convertLength(1, 'us-survey-foot', 'foot');
    expect(ratio.minus(1).times(1e6).toFixed(1)).toBe('2.0');
  });

  it('has 5,280 ft in a mile, 1,609.344 m exactly (NIST SP 811 B.8, 2008)', () => {
    expect(convertLength(1, 'mile', 'foot').toString()).toBe('5280');
    expect(convertLength(1, 'mile', 'metre').toString()).toBe('1609.344');
  });
});

describe('area definitions', () => {
  it('gives the international acre as exactly 4,046.856 422 4 m² (NIST / 85 FR 62698, 2020)', () => {
    expect(convertArea(1, 'acre', 'square-metre').toString()).toBe('4046.8564224');
  });

  it('gives the US survey acre as 4,046.872 609 874 m², SP 811 factor 4.046 873 E+03 (NIST SP 811 B.8)', () => {
    expect(convertArea(1, 'us-survey-acre', 'square-metre').toFixed(9)).toBe('4046.872609874');
    expect(convertArea(1, 'us-survey-acre', 'square-metre').toSignificantDigits(7).toString()).toBe('4046.873');
  });

  it('puts 43,560 ft² in an acre and 0.404 685 642 24 ha (NIST SP 811 B.8; trade reference §8 [C-calc])', () => {
    expect(convertArea(1, 'acre', 'square-foot').toString()).toBe('43560');
    expect(convertArea(1, 'acre', 'hectare').toString()).toBe('0.40468564224');
  });

  it('puts 2.471 053 8 acres in a hectare (trade reference §8 [C-calc] from the NIST acre)', () => {
    expect(convertArea(1, 'hectare', 'acre').toFixed(7)).toBe('2.4710538');
  });

  it('converts any area there and back without loss beyond 1e-20', () => {
    const units: AreaUnit[] = ['square-metre', 'square-foot', 'acre', 'us-survey-acre', 'hectare'];
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 10_000_000 }),
        fc.constantFrom(...units),
        fc.constantFrom(...units),
        (value, from, to) => {
          const back = convertArea(convertArea(value, from, to), to, from);
          expect(back.minus(value).abs().lt('1e-20')).toBe(true);
        },
      ),
    );
  });
});

describe('roadStripAcres', () => {
  it('uses 8.25 = 43,560 / 5,280 (Iowa State AgDM A3-24; trade reference §8)', () => {
    expect(ROAD_STRIP_DIVISOR.toString()).toBe('8.25');
  });

  it('finds a mile of 8.25-ft strip to be one acre (43,560 ft² by definition, NIST SP 811)', () => {
    expect(roadStripAcres(1, '8.25').toString()).toBe('1');
  });

  it('finds 3 miles of a 15-ft ditch bank to be 5.4545 acres (3 × 15 × 5,280 / 43,560, definition)', () => {
    expect(roadStripAcres('3', '15').toFixed(4)).toBe('5.4545');
  });
});
