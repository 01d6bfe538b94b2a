/**
 * Health and safety cautions, in our own words, kept short (aimed at grade 6 or lower).
 *
 * Shellfish cautions (on every bulletin that mentions shellfish):
 * - the bulletin is not a harvest opening or closure notice;
 * - harvest status comes from the shellfish-sanitation or public-health authority named in the
 *   scenario, whose contact is given: check it before harvesting;
 * - bacterial and biotoxin closures are separate and these figures say nothing about them;
 * - no food-safety limit for microplastics in shellfish exists: EFSA CONTAM Panel (2016), EFSA
 *   Journal 14(6):4501 ("no legislation for microplastics and nanoplastics as contaminants in
 *   food"); FAO (2017), Fisheries and Aquaculture Technical Paper 615 (large knowledge gaps);
 * - follow local rules and licensed practice.
 * Debris cautions (common practice for beach clean-ups): gloves, sharp objects, never open unknown
 * containers or drums, report them, wash hands, leave hurt animals to trained rescuers.
 */
import type { Caution, Contact } from '../model/types.ts';
import { contactLines, findContact } from './contacts.ts';

export function shellfishCautions(authorities: readonly Contact[]): Caution[] {
  const authority = findContact(authorities, 'shellfish-sanitation', 'public-health');
  const who = authority ? `${authority.name}.` : 'the local shellfish or health office.';
  const lines = authority ? contactLines(authority) : '';
  return [
    { id: 'not-a-closure', text: 'This bulletin does not open or close any shellfish beds.' },
    {
      id: 'check-authority',
      text: `Only the shellfish office can say if you may harvest. Check with them first: ${who}${lines ? ` ${lines}` : ''}`,
    },
    {
      id: 'separate-closures',
      text: 'Beds can also close for germs or for toxins from algae. Those closures are set on their own. These plastic figures say nothing about them.',
    },
    {
      id: 'no-safe-limit',
      text: 'There is no food safety limit for tiny bits of plastic in shellfish. Experts say too little is known to set one (EFSA 2016; FAO 2017). So these figures cannot tell you if shellfish are safe to eat.',
    },
    { id: 'local-rules', text: 'Follow local rules and the terms of your licence.' },
  ];
}

export function debrisCautions(authorities: readonly Contact[]): Caution[] {
  const report = findContact(authorities, 'debris-report', 'public-health');
  const rescue = findContact(authorities, 'wildlife-rescue');
  const cautions: Caution[] = [
    { id: 'gloves', text: 'Wear thick gloves when you pick up litter.' },
    { id: 'sharp-objects', text: 'Look out for sharp things such as glass, metal and needles. Do not touch needles.' },
    { id: 'unknown-containers', text: 'Do not open drums, cans or boxes when you do not know what is in them. Keep away and keep others away.' },
    {
      id: 'report-debris',
      text: report ? `Tell ${report.name} what you found and where.${contactLines(report) ? ` ${contactLines(report)}` : ''}` : 'Tell the local council what you found and where.',
    },
    { id: 'wash-hands', text: 'Wash your hands when you are done.' },
  ];
  if (rescue) {
    const lines = contactLines(rescue);
    cautions.push({
      id: 'hurt-animals',
      text: `If you find a hurt or trapped animal, do not free it yourself. Call ${rescue.name}.${lines ? ` ${lines}` : ''}`,
    });
  }
  return cautions;
}
