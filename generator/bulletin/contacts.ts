/**
 * Contacts in plain text for sentences. Details are written as short lines of their own
 * ("Phone 01632 960123."), the way a contact card reads, after the name.
 */
import type { Contact } from '../model/types.ts';

/** "Harbour Shellfish Office (phone 01632 960123, email …, web …)" — for one-line use. */
export function contactDetails(contact: Contact): string {
  const parts: string[] = [];
  if (contact.phone) parts.push(`phone ${contact.phone}`);
  if (contact.email) parts.push(`email ${contact.email}`);
  if (contact.url) parts.push(`web ${contact.url}`);
  return parts.length > 0 ? `${contact.name} (${parts.join(', ')})` : contact.name;
}

/** "Phone 01632 960123. Email desk@example.org. Web https://…" — empty when there are none. */
export function contactLines(contact: Contact): string {
  const parts: string[] = [];
  if (contact.phone) parts.push(`Phone ${contact.phone}.`);
  if (contact.email) parts.push(`Email ${contact.email}.`);
  if (contact.url) parts.push(`Web ${contact.url}`);
  return parts.join(' ');
}

export function findContact(contacts: readonly Contact[], ...roles: Contact['role'][]): Contact | null {
  for (const role of roles) {
    const found = contacts.find((c) => c.role === role);
    if (found) return found;
  }
  return null;
}
