/**
 * The publisher's logo in the model: the reference site.json carries (content-addressed file
 * name, kind, size) and the file the model folder holds for the site to copy. The
 * name is the first 32 hex digits of the file's SHA-256, so the same logo always gets the same
 * address (reproducible builds) and a changed logo a new one (no stale copy in any cache).
 */
import type { LoadedScenario, PublisherLogo } from '../scenario/types.ts';
import type { PublisherLogoRef } from './types.ts';

/** Folder of the logo in the model folder and in the built site. */
export const publisherLogoFolder = 'publisher-logo';

const extensionOf: { readonly [type in PublisherLogo['type']]: string } = { png: 'png', jpeg: 'jpg', webp: 'webp' };

export function publisherLogoFileName(logo: Pick<PublisherLogo, 'sha256' | 'type'>): string {
  if (!/^[0-9a-f]{64}$/.test(logo.sha256)) throw new Error(`publisher logo: "${logo.sha256}" is not a SHA-256 in hex`);
  return `${logo.sha256.slice(0, 32)}.${extensionOf[logo.type]}`;
}

/** The logo's entry of site.json. */
export function publisherLogoRef(logo: PublisherLogo): PublisherLogoRef {
  const file = publisherLogoFileName(logo);
  return { file, href: `/${publisherLogoFolder}/${file}`, sha256: logo.sha256, mediaType: logo.mediaType, width: logo.width, height: logo.height };
}

/** The file the model folder holds for the site (written by write-model.ts), or nothing. */
export function publisherLogoAsset(scenario: Pick<LoadedScenario, 'publisherLogo'>): { publisherLogo?: { file: string; bytes: Uint8Array } } {
  const logo = scenario.publisherLogo;
  return logo ? { publisherLogo: { file: publisherLogoFileName(logo), bytes: logo.bytes } } : {};
}
