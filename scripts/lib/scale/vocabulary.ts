// Invented words for invented people and shops: syllables that make no one's real name, and plain trade words.
import type { Rng } from './random';

const ONSETS = ['b', 'd', 'f', 'g', 'k', 'l', 'm', 'n', 'p', 'r', 's', 't', 'v', 'z', 'br', 'dr', 'kr', 'st', 'th', 'sh'];
const VOWELS = ['a', 'e', 'i', 'o', 'u', 'ai', 'eo', 'ia'];
const CODAS = ['', 'n', 'r', 'l', 's', 'th', 'nd', 'rk', 'x'];

function syllable(rng: Rng): string {
  return rng.pick(ONSETS) + rng.pick(VOWELS) + rng.pick(CODAS);
}

function word(rng: Rng, syllables: number): string {
  let w = '';
  for (let i = 0; i < syllables; i++) w += syllable(rng);
  return w.charAt(0).toUpperCase() + w.slice(1);
}

/** "Talven Orsk": two invented words. */
export function personName(rng: Rng): string {
  return `${word(rng, rng.int(1, 2))} ${word(rng, rng.int(1, 3))}`;
}

const SHOP_FIRST = ['Iron', 'Copper', 'Brass', 'Cedar', 'Granite', 'Silver', 'Juniper', 'Basalt', 'Harbor', 'Prairie', 'Canyon', 'Orchard', 'Lantern', 'Ridge', 'Willow', 'Anvil'];
const SHOP_SECOND = ['Creek', 'Hollow', 'Mill', 'Yard', 'Bend', 'Row', 'Gate', 'Field', 'Point', 'Crossing', 'Works', 'Flats'];
const SHOP_KIND = ['Wheel Shop', 'Spoke Room', 'Lace Works', 'Truing Bench', 'Wheelwrights', 'Rim & Hub', 'Wheel Co-op', 'Build Bench'];

/** An invented shop name; the index keeps it unique. */
export function shopName(rng: Rng, index: number): string {
  return `${rng.pick(SHOP_FIRST)} ${rng.pick(SHOP_SECOND)} ${rng.pick(SHOP_KIND)} ${index + 1}`;
}

export function slugify(text: string): string {
  return text
    .toLowerCase()
    .replace(/&/g, 'and')
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '');
}

const SHOP_BIOS = [
  'Wide rims and high spoke counts are most of what we lace. Bring the frame and we will check the spacing.',
  'A small bench shop building cruiser and fat-tire wheels, shipped double-boxed.',
  'Show wheels and riding wheels; we drill flanges for heavy spokes when the hub calls for it.',
  'We true, tension and stress-relieve every wheel twice before it leaves the stand.',
];

export const shopBio = (rng: Rng) => rng.pick(SHOP_BIOS);

const REQUEST_NOTES = [
  'Looking for a matching pair for a beach cruiser.',
  'Show bike; finish matters more than weight.',
  'Daily rider, needs to survive potholes.',
  'Frame measured twice; happy to send photos.',
  'Snow and sand bike, no rush.',
  '',
];
export const requestNotes = (rng: Rng) => rng.pick(REQUEST_NOTES);

const BID_MESSAGES = [
  'Rims and hubs in stock; we can start next week.',
  'We have built this exact combination before. Pickup or shipping both fine.',
  'Flanges get drilled for the heavier gauge; included in the labour line.',
  'Happy to build these. Lead time includes the finish.',
  'We ship in a double box with the axle protected.',
];
export const bidMessage = (rng: Rng) => rng.pick(BID_MESSAGES);

const RIDER_LINES = [
  'Could you do this with a polished finish instead?',
  'What spoke brand would you use?',
  'Is the lead time firm? I need it before a show.',
  'Thanks, can you confirm the hub spacing is right for my frame?',
  'Does the price include shipping to my ZIP?',
];
const SHOP_LINES = [
  'Yes, the spacing works; we will confirm once the frame measurements arrive.',
  'Shipping is included in the bid.',
  'We can hit that date if you accept this week.',
  'Polished adds a little; I can revise the bid if you want it.',
  'Sent you a photo of a similar build in the notes.',
];
export const riderLine = (rng: Rng) => rng.pick(RIDER_LINES);
export const shopLine = (rng: Rng) => rng.pick(SHOP_LINES);

const REVIEW_BODIES = ['Wheels arrived true and well packed.', 'Good communication throughout.', 'Took a little longer than promised but built well.', 'Clear spec, paid promptly.', ''];
export const reviewBody = (rng: Rng) => rng.pick(REVIEW_BODIES);
