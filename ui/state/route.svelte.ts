/**
 * Where the screens are: the Homes list, the Portfolio, the Library, the Settings, or a section of one home's workspace, kept in the
 * address's fragment (`#/homes/12/leak-test`) so a reload returns to the same place.
 */

/** The sections of an open home built so far, in the navigation's order. */
export const SECTIONS = [
  { slug: 'house', name: 'House' },
  { slug: 'leak-test', name: 'Leak test' },
  { slug: 'measures', name: 'Measures' },
  { slug: 'plan', name: 'Plan' },
  { slug: 'safety', name: 'Safety' },
  { slug: 'proposal', name: 'Proposal' },
  { slug: 'work-order', name: 'Work order' },
] as const;

export type Section = (typeof SECTIONS)[number];
export type SectionSlug = Section['slug'];

export type Place =
  | { screen: 'homes' }
  | { screen: 'portfolio' }
  | { screen: 'library' }
  | { screen: 'settings' }
  | { screen: 'home'; homeId: number; section: SectionSlug };

function isSectionSlug(text: string): text is SectionSlug {
  return SECTIONS.some((section) => section.slug === text);
}

/** The place a fragment names; anything unknown is the Homes list. */
export function placeOf(hash: string): Place {
  if (/^#\/portfolio\/?$/.test(hash)) return { screen: 'portfolio' };
  if (/^#\/library\/?$/.test(hash)) return { screen: 'library' };
  if (/^#\/settings\/?$/.test(hash)) return { screen: 'settings' };
  const match = /^#\/homes\/(\d{1,9})(?:\/([a-z-]+))?\/?$/.exec(hash);
  if (match === null) return { screen: 'homes' };
  const homeId = Number(match[1]);
  const slug = match[2] ?? 'house';
  if (homeId < 1 || !isSectionSlug(slug)) return { screen: 'homes' };
  return { screen: 'home', homeId, section: slug };
}

/** The fragment of a place, for links. */
export function hrefOf(place: Place): string {
  return place.screen === 'home' ? `#/homes/${place.homeId}/${place.section}` : `#/${place.screen}`;
}

/** The section's name as the navigation shows it. */
export function sectionName(slug: SectionSlug): string {
  return SECTIONS.find((section) => section.slug === slug)?.name ?? slug;
}

/** The current place, following the address as links are followed and history is walked. */
export class Route {
  place = $state<Place>(placeOf(location.hash));

  /** Starts following the address; returns the function that stops it. */
  follow(): () => void {
    const update = (): void => {
      this.place = placeOf(location.hash);
    };
    window.addEventListener('hashchange', update);
    return () => window.removeEventListener('hashchange', update);
  }
}
