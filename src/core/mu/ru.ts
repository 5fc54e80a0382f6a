/**
 * Resource units of a multi-user exchange: how many RUs of one size fit a
 * channel, and the `users` argument checked against it.
 *
 * RU tone plan (IEEE Std 802.11ax-2021 27.3.2.2, subclause number from
 * memory): a 20 MHz channel holds 9 × RU26, 4 × RU52, 2 × RU106 or
 * 1 × RU242; 40 MHz twice that plus 1 × RU484; 80 MHz 37 × RU26 (two 40 MHz
 * halves and the centre 26-tone RU), 16 × RU52, 8 × RU106, 4 × RU242,
 * 2 × RU484 or 1 × RU996; 160 MHz twice the 80 MHz plan plus 1 × RU2x996.
 * EHT (IEEE Std 802.11be-2024 36.3.2) keeps these plans per 80 MHz (from
 * memory) and adds 320 MHz, twice 160 MHz. Every user gets the link's RU
 * (equal RUs, no MU-MIMO), so the largest count of that RU size bounds the
 * users; a link without an RU token is the whole channel, one user.
 * EHT multiple resource units (MRUs) have no link token and are not modelled.
 */
import { invalid } from "../errors";
import { describe } from "../args";
import type { Link } from "../link";
import { ruName } from "../phy/he";

/** RUs of each size (tones, 1992 = 2×996, 3984 = 4×996) that one channel of each width holds. */
export const RUS_PER_CHANNEL: Readonly<Record<number, Readonly<Record<number, number>>>> = {
  20: { 26: 9, 52: 4, 106: 2, 242: 1 },
  40: { 26: 18, 52: 8, 106: 4, 242: 2, 484: 1 },
  80: { 26: 37, 52: 16, 106: 8, 242: 4, 484: 2, 996: 1 },
  160: { 26: 74, 52: 32, 106: 16, 242: 8, 484: 4, 996: 2, 1992: 1 },
  320: { 26: 148, 52: 64, 106: 32, 242: 16, 484: 8, 996: 4, 1992: 2, 3984: 1 },
};

/** Users one exchange can serve on the link's RU: the RUs of that size in the channel; 1 on the whole channel. */
export function maxUsers(link: Link): number {
  if (link.ruTones === null) return 1;
  return RUS_PER_CHANNEL[link.widthMHz][link.ruTones];
}

/** `link` must be HE or EHT and not an ER SU PPDU (a single-user format). */
export function checkMultiUserLink(link: Link): void {
  if (link.family !== "HE" && link.family !== "EHT") notMultiUserFamily(link);
  if (link.extendedRange) invalid(`link: an HE ER SU PPDU serves one user; drop ER for a multi-user exchange (${link.text})`);
}

function notMultiUserFamily(link: Link): never {
  invalid(`link: multi-user OFDMA needs an HE or EHT link, got ${link.family} (${link.text})`);
}

/** `users`: a whole number from 1 to the RUs of the link's size in its channel. */
export function checkUsers(users: unknown, link: Link): number {
  const max = maxUsers(link);
  if (typeof users !== "number" || !Number.isInteger(users) || users < 1) badUsers(users, link, max);
  if (users > max) tooManyUsers(users, link, max);
  return users;
}

function validUsersText(link: Link, max: number): string {
  if (link.ruTones === null) {
    return `1 on the whole channel (give the link an RU token for more: up to ${RUS_PER_CHANNEL[link.widthMHz][26]} × RU26 in ${link.widthMHz} MHz)`;
  }
  return `1–${max} (${max} × ${ruName(link.ruTones)} fit in ${link.widthMHz} MHz)`;
}

function badUsers(users: unknown, link: Link, max: number): never {
  invalid(`users: expected a whole number of stations, ${validUsersText(link, max)}, got ${describe(users)}`);
}

function tooManyUsers(users: number, link: Link, max: number): never {
  if (link.ruTones === null) {
    invalid(`users: ${users} users need OFDMA resource units or MU-MIMO (not modelled); the link has no RU, so use ${validUsersText(link, max)}`);
  }
  invalid(`users: ${users} is more than fit: ${validUsersText(link, max)} by the RU tone plan; use fewer users, a smaller RU or a wider channel`);
}
