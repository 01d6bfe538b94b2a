/**
 * Areas of a national coast (generator/model/areas.ts): recursive coordinate bisection (Berger &
 * Bokhari 1987) into areas of at most 60 segments, areas given in the segments file, names, and
 * the overview's place names.
 */
import { describe, expect, it } from 'vitest';
import { areaName, areaRegionalSites, bisect, mapPlaces, planAreas, usesAreas } from '../../generator/model/areas.ts';

/** n segments 1 km apart along a north–south coast starting at 40° S, 120° W. */
function coast(n: number, extra: (i: number) => { place?: string | null; area?: string } = () => ({})) {
  return Array.from({ length: n }, (_, i) => {
    const lat = -40 - i / 110.574;
    return { id: `seg-${String(i + 1).padStart(4, '0')}`, place: null as string | null, bbox: [-120, lat - 0.004, -119.99, lat] as [number, number, number, number], ...extra(i) };
  });
}

describe('areas', () => {
  it('2,000 segments make 34 areas of at most 60, each a run of neighbours along the coast', () => {
    const plans = planAreas(coast(2000));
    expect(plans).toHaveLength(Math.ceil(2000 / 60));
    expect(Math.max(...plans.map((p) => p.segmentIds.length))).toBeLessThanOrEqual(60);
    const all = plans.flatMap((p) => p.segmentIds);
    expect(new Set(all).size).toBe(2000);
    // numbered north to south, each area a contiguous run of segment numbers
    for (const plan of plans) {
      const numbers = plan.segmentIds.map((id) => Number(id.slice(4))).sort((a, b) => a - b);
      expect(numbers[numbers.length - 1]! - numbers[0]! + 1).toBe(numbers.length);
    }
    expect(plans[0]!.segmentIds).toContain('seg-0001');
    expect(plans.map((p) => p.number)).toEqual(plans.map((_, i) => i + 1));
  });

  it('bisection sizes stay balanced: 61 points make 2 groups of 30 and 31, not 60 and 1', () => {
    const points = Array.from({ length: 61 }, (_, i) => [0, -i] as [number, number]);
    expect(
      bisect(points, 60)
        .map((g) => g.length)
        .sort(),
    ).toEqual([30, 31]);
  });

  it('areas given in the segments file are kept, in order, and a large one is split in parts', () => {
    const segments = coast(150, (i) => ({ area: i < 20 ? 'North Firth' : 'South Reach' }));
    const plans = planAreas(segments);
    expect(plans.map((p) => p.name)).toEqual(['North Firth', 'South Reach (part 1 of 3)', 'South Reach (part 2 of 3)', 'South Reach (part 3 of 3)']);
    expect(plans[0]!.segmentIds).toHaveLength(20);
    expect(new Set(plans.map((p) => p.id)).size).toBe(4);
  });

  it('names an area from its places', () => {
    expect(areaName([null, 'Ardle', 'Ardle', null], 3)).toBe('Ardle');
    expect(areaName(['Ardle', 'Brisk', 'Carrow'], 3)).toBe('Ardle to Carrow');
    expect(areaName([null, null], 7)).toBe('Area 7');
  });

  it('the overview shows areas above 150 segments only', () => {
    expect(usesAreas(30)).toBe(false);
    expect(usesAreas(150)).toBe(false);
    expect(usesAreas(151)).toBe(true);
  });

  it("regional runs per area keep only the area's sites with data", () => {
    const runs = areaRegionalSites(
      [
        { id: 'a', number: 1, name: 'A', segmentIds: ['s1', 's2'] },
        { id: 'b', number: 2, name: 'B', segmentIds: ['s3'] },
      ],
      [
        { indicator: 'beach-litter', sites: ['s1', 's3'] },
        { indicator: 'water-microplastics', sites: ['s2'] },
      ],
    );
    expect(runs).toEqual([
      { area: 'a', indicator: 'beach-litter', sites: ['s1'] },
      { area: 'a', indicator: 'water-microplastics', sites: ['s2'] },
      { area: 'b', indicator: 'beach-litter', sites: ['s3'] },
    ]);
  });

  it('place names: the places with most segments, at their middle, across 180° too', () => {
    const segments = [
      { id: 'a', place: 'Levuka', bbox: [179.9, -17.7, 179.95, -17.6] as [number, number, number, number] },
      { id: 'b', place: 'Levuka', bbox: [-179.95, -17.7, -179.9, -17.6] as [number, number, number, number] },
      { id: 'c', place: 'Savusavu', bbox: [179.3, -16.8, 179.35, -16.7] as [number, number, number, number] },
    ];
    const places = mapPlaces(segments, 1);
    expect(places).toHaveLength(1);
    expect(places[0]!.name).toBe('Levuka');
    expect(Math.abs(Math.abs(places[0]!.lon) - 180)).toBeLessThan(1e-6);
    expect(places[0]!.lat).toBeCloseTo(-17.65, 6);
  });
});

describe('composeArea', () => {
  it('orders places highest level first, then by name, and words the highest level and counts', async () => {
    const { composeArea } = await import('../../generator/model/compose-region.ts');
    const level = (id: 'scant' | 'marked', rank: 1 | 3, label: string) => ({ id, rank, label, hits: [] });
    const area = composeArea(
      { id: 'area-x', number: 2, name: 'Ardle to Carrow', segmentIds: ['a', 'b', 'c'] },
      [
        { id: 'a', name: 'Carrow Sands', level: level('scant', 1, 'Scant') },
        { id: 'b', name: 'Brisk Point', level: level('marked', 3, 'Marked') },
        { id: 'c', name: 'Ardle Beach', level: level('scant', 1, 'Scant') },
      ],
      [],
    );
    expect(area.segmentIds).toEqual(['b', 'c', 'a']);
    expect(area.level).toEqual({ id: 'marked', rank: 3, label: 'Marked' });
    expect(area.counts.map((c) => [c.level, c.n])).toEqual([
      ['heavy', 0],
      ['marked', 1],
      ['noticeable', 0],
      ['scant', 2],
    ]);
    expect(area.headline).toBe('Ardle to Carrow: the highest level is Marked (level 3 of 4), at 1 of 3 places.');
    expect(area.summary).toEqual(['Levels of the 3 places in this area: 1 Marked, 2 Scant.']);
  });
});
