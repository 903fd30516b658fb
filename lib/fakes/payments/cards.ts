// The API's documented test card numbers and what each one does on this fake.

export type CardOutcome =
  | { kind: 'succeed' }
  | { kind: 'decline'; code: string; declineCode: string; message: string }
  | { kind: 'authenticate' };

export interface TestCard {
  number: string;
  brand: 'visa' | 'mastercard';
  /** Plain words for the hosted page's list of test numbers. */
  label: string;
  outcome: CardOutcome;
}

const decline = (code: string, declineCode: string, message: string): CardOutcome => ({
  kind: 'decline',
  code,
  declineCode,
  message,
});

export const TEST_CARDS: readonly TestCard[] = [
  { number: '4242424242424242', brand: 'visa', label: 'approved', outcome: { kind: 'succeed' } },
  { number: '5555555555554444', brand: 'mastercard', label: 'approved', outcome: { kind: 'succeed' } },
  {
    number: '4000000000009995',
    brand: 'visa',
    label: 'declined: insufficient funds',
    outcome: decline('card_declined', 'insufficient_funds', 'Your card has insufficient funds.'),
  },
  {
    number: '4000000000000002',
    brand: 'visa',
    label: 'declined',
    outcome: decline('card_declined', 'generic_decline', 'Your card was declined.'),
  },
  {
    number: '4000000000000069',
    brand: 'visa',
    label: 'declined: expired card',
    outcome: decline('expired_card', 'expired_card', 'Your card has expired.'),
  },
  {
    number: '4000000000000127',
    brand: 'visa',
    label: 'declined: wrong security code',
    outcome: decline('incorrect_cvc', 'incorrect_cvc', "Your card's security code is incorrect."),
  },
  {
    number: '4000002500003155',
    brand: 'visa',
    label: 'asks the cardholder to confirm',
    outcome: { kind: 'authenticate' },
  },
];

/** Test payment-method ids accepted by `confirm`, mapped to the card each stands for. */
export const TEST_PAYMENT_METHOD_TOKENS: Readonly<Record<string, string>> = {
  pm_card_visa: '4242424242424242',
  pm_card_mastercard: '5555555555554444',
  pm_card_chargeDeclined: '4000000000000002',
  pm_card_chargeDeclinedInsufficientFunds: '4000000000009995',
  pm_card_chargeDeclinedExpiredCard: '4000000000000069',
  pm_card_chargeDeclinedIncorrectCvc: '4000000000000127',
  pm_card_authenticationRequired: '4000002500003155',
};

export function normalizeCardNumber(input: string): string {
  return input.replace(/[\s-]/g, '');
}

export function findTestCard(input: string): TestCard | undefined {
  const number = normalizeCardNumber(input);
  return TEST_CARDS.find((card) => card.number === number);
}

export function luhnValid(number: string): boolean {
  if (!/^\d{12,19}$/.test(number)) return false;
  let sum = 0;
  for (let i = 0; i < number.length; i++) {
    let d = Number(number[number.length - 1 - i]);
    if (i % 2 === 1) {
      d *= 2;
      if (d > 9) d -= 9;
    }
    sum += d;
  }
  return sum % 10 === 0;
}

/** Accepts "MM/YY", "MM / YYYY" or "MMYY"; null when unreadable. */
export function parseExpiry(input: string): { month: number; year: number } | null {
  const m = /^\s*(\d{1,2})\s*\/?\s*(\d{2}|\d{4})\s*$/.exec(input);
  if (!m) return null;
  const month = Number(m[1]);
  let year = Number(m[2]);
  if (year < 100) year += 2000;
  if (month < 1 || month > 12) return null;
  return { month, year };
}

export function expiryInPast(expiry: { month: number; year: number }, now = new Date()): boolean {
  const y = now.getUTCFullYear();
  const mo = now.getUTCMonth() + 1;
  return expiry.year < y || (expiry.year === y && expiry.month < mo);
}
