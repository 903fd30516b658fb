import { afterAll, describe, expect, it } from 'vitest';
import { createAccount, loadSessionUser, verifyCredentials } from '@/lib/auth/accounts';
import { Conflict, Invalid } from '@/lib/errors';
import { testDb, uniqueEmail } from '../support/db';

const db = testDb();
afterAll(() => db.destroy());

describe('accounts', () => {
  it('signs up a rider with a hashed password', async () => {
    const email = uniqueEmail('rider');
    const user = await createAccount(db, { role: 'rider', name: 'Test Rider', email, password: 'a long enough password' });
    expect(user).toMatchObject({ email, role: 'rider', shopId: null });
    const row = await db('users').where({ id: user.id }).first();
    expect(row.password_hash).toMatch(/^\$2[aby]\$/);
    expect(row.password_hash).not.toContain('a long enough password');
  });

  it('signs up a builder together with their shop, placed by ZIP code', async () => {
    const email = uniqueEmail('builder');
    const user = await createAccount(db, { role: 'builder', name: 'Test Builder', email, password: 'another long password', shopName: 'Test Spoke Bench', zip: '87501' });
    expect(user.role).toBe('builder');
    expect(user.shopId).toBeTruthy();
    const shop = await db('shops').where({ id: user.shopId }).first();
    expect(shop).toMatchObject({ name: 'Test Spoke Bench', region: 'NM' });
    expect(shop.latitude).toBeCloseTo(35.69, 1); // ZIP 87501 centroid from the zipcodes package's dataset
    expect(shop.slug).toMatch(/^test-spoke-bench/);
    const session = await loadSessionUser(db, user.id);
    expect(session?.shopId).toBe(user.shopId);
  });

  it('gives two shops with the same name different slugs', async () => {
    const a = await createAccount(db, { role: 'builder', name: 'A', email: uniqueEmail(), password: 'password-long-1', shopName: 'Same Name Wheels', zip: '90802' });
    const b = await createAccount(db, { role: 'builder', name: 'B', email: uniqueEmail(), password: 'password-long-2', shopName: 'Same Name Wheels', zip: '90802' });
    const slugs = await db('shops').whereIn('id', [a.shopId, b.shopId]).pluck('slug');
    expect(new Set(slugs).size).toBe(2);
  });

  it('refuses a second account with the same e-mail, and leaves no half-made rows', async () => {
    const email = uniqueEmail('dup');
    await createAccount(db, { role: 'rider', name: 'First', email, password: 'first password!' });
    const shopsBefore = await db('shops').count<{ count: string }[]>('* as count');
    await expect(
      createAccount(db, { role: 'builder', name: 'Second', email, password: 'second password', shopName: 'Ghost Shop', zip: '87501' }),
    ).rejects.toBeInstanceOf(Conflict);
    const shopsAfter = await db('shops').count<{ count: string }[]>('* as count');
    expect(shopsAfter[0].count).toBe(shopsBefore[0].count);
  });

  it('refuses a builder with an unknown ZIP code, naming the field', async () => {
    const attempt = createAccount(db, { role: 'builder', name: 'Nowhere', email: uniqueEmail(), password: 'password-long-3', shopName: 'Nowhere Wheels', zip: '00000' });
    await expect(attempt).rejects.toBeInstanceOf(Invalid);
    await expect(attempt).rejects.toMatchObject({ fieldErrors: { zip: [expect.any(String)] } });
  });

  it('checks passwords, answering the same for an unknown e-mail and a wrong password', async () => {
    const email = uniqueEmail('login');
    await createAccount(db, { role: 'rider', name: 'Login', email, password: 'correct horse battery' });
    expect(await verifyCredentials(db, email, 'correct horse battery')).toMatchObject({ email, role: 'rider' });
    expect(await verifyCredentials(db, email.toUpperCase(), 'correct horse battery')).toMatchObject({ email });
    expect(await verifyCredentials(db, email, 'wrong horse battery')).toBeNull();
    expect(await verifyCredentials(db, uniqueEmail('nobody'), 'correct horse battery')).toBeNull();
  });
});
