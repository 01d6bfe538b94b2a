import { describe, expect, test } from 'vitest';
import { debrisCautions, shellfishCautions } from '../../generator/bulletin/cautions.ts';
import { readability } from '../../generator/bulletin/readability.ts';
import type { Contact } from '../../generator/model/types.ts';

const authorities: Contact[] = [
  { role: 'shellfish-sanitation', name: 'Saltmere Shellfish Office', phone: '01632 960123', url: 'https://example.org/shellfish' },
  { role: 'debris-report', name: 'Saltmere Coast Desk', phone: '01632 960456' },
  { role: 'wildlife-rescue', name: 'Saltmere Seal Rescue', phone: '01632 960789' },
];

describe('shellfish cautions', () => {
  const cautions = shellfishCautions(authorities);
  const text = cautions.map((c) => c.text).join(' ');
  test('say the bulletin opens or closes nothing, name the authority with its contact, and defer to it', () => {
    expect(cautions.map((c) => c.id)).toEqual(['not-a-closure', 'check-authority', 'separate-closures', 'no-safe-limit', 'local-rules']);
    expect(text).toContain('does not open or close any shellfish beds');
    expect(text).toContain('Saltmere Shellfish Office');
    expect(text).toContain('01632 960123');
    expect(text).toContain('https://example.org/shellfish');
    expect(text).toContain('Check with them first');
  });
  test('bacterial and biotoxin closures are separate; no food limit exists (EFSA 2016; FAO 2017)', () => {
    expect(text).toContain('germs or for toxins from algae');
    expect(text).toContain('say nothing about them');
    expect(text).toContain('There is no food safety limit for tiny bits of plastic in shellfish.');
    expect(text).toContain('(EFSA 2016; FAO 2017)');
    // Neither alarm nor reassurance: the figures cannot tell if shellfish are safe.
    expect(text).toContain('cannot tell you if shellfish are safe to eat');
    expect(text).not.toMatch(/\b(dangerous|unsafe|harmless|no risk)\b/i);
  });
  test('public-health office stands in when no shellfish-sanitation office is named', () => {
    const only = shellfishCautions([{ role: 'public-health', name: 'Saltmere Health Board', email: 'health@example.org' }]);
    expect(only[1]?.text).toBe('Only the shellfish office can say if you may harvest. Check with them first: Saltmere Health Board. Email health@example.org.');
  });
  test('read at grade 6 or lower (Flesch–Kincaid, Kincaid et al. 1975; US EPA aims at grade 4–6 for critical information)', () => {
    const grade = readability(cautions.map((c) => c.text)).grade;
    expect(grade).not.toBeNull();
    expect(grade ?? 99).toBeLessThanOrEqual(6);
  });
});

describe('debris cautions (common practice for beach clean-ups)', () => {
  const cautions = debrisCautions(authorities);
  const text = cautions.map((c) => c.text).join(' ');
  test('gloves, sharp objects, unknown containers and drums, report with contact', () => {
    expect(text).toContain('gloves');
    expect(text).toContain('sharp');
    expect(text).toContain('Do not open drums');
    expect(text).toContain('Tell Saltmere Coast Desk what you found and where. Phone 01632 960456.');
    expect(text).toContain('Call Saltmere Seal Rescue.');
  });
  test('read at grade 6 or lower', () => {
    expect(readability(cautions.map((c) => c.text)).grade ?? 99).toBeLessThanOrEqual(6);
  });
});
