// The fake keeps its objects, keys and unfinished deliveries across its own restarts.
import { appendFileSync, copyFileSync, existsSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { closedPort, paidIntent, startFake, startReceiver, WEBHOOK_SECRET, type FakeHandle } from './helpers';

const cleanups: (() => Promise<void>)[] = [];
afterEach(async () => {
  while (cleanups.length) await cleanups.pop()!();
});

async function started(options: Parameters<typeof startFake>[0] = {}): Promise<FakeHandle> {
  const h = await startFake(options);
  cleanups.push(() => h.close());
  return h;
}

describe('payments fake: state across restarts', () => {
  it('finds its objects, balance and idempotency keys again after a restart', async () => {
    const h = await started();
    const customer = await h.stripe.customers.create({ email: 'kept@example.test' });
    const { pi, chargeId } = await paidIntent(h, 11_000, { customer: customer.id });
    const acct = await h.stripe.accounts.create({ type: 'express', capabilities: { transfers: { requested: true } } });
    await h.control(`/_test/accounts/${acct.id}/onboard`);
    const transfer = await h.stripe.transfers.create(
      { amount: 4_000, currency: 'usd', destination: acct.id, source_transaction: chargeId },
      { idempotencyKey: 'payout-job-3' },
    );
    const balanceBefore = await h.stripe.balance.retrieve();

    expect(existsSync(h.dataFile)).toBe(true);
    expect(() => JSON.parse(readFileSync(h.dataFile, 'utf8'))).not.toThrow();
    await h.restart();

    expect((await h.stripe.customers.retrieve(customer.id)).id).toBe(customer.id);
    expect((await h.stripe.paymentIntents.retrieve(pi.id)).status).toBe('succeeded');
    expect((await h.stripe.charges.retrieve(chargeId)).amount).toBe(11_000);
    expect((await h.stripe.accounts.retrieve(acct.id)).payouts_enabled).toBe(true);
    expect((await h.stripe.transfers.retrieve(transfer.id)).amount).toBe(4_000);
    expect((await h.stripe.balance.retrieve()).available).toEqual(balanceBefore.available);
    const replay = await h.stripe.transfers.create(
      { amount: 4_000, currency: 'usd', destination: acct.id, source_transaction: chargeId },
      { idempotencyKey: 'payout-job-3' },
    );
    expect(replay.id).toBe(transfer.id);
    expect((await h.stripe.transfers.list({ destination: acct.id })).data).toHaveLength(1);
    // After a clean restart the journal is folded in and no temporary file is left behind.
    expect(readdirSync(h.dir)).toEqual(['state.json']);
  });

  it('recovers from a crash: the journal is replayed and a line cut short is ignored', async () => {
    const h = await started();
    const customer = await h.stripe.customers.create({ email: 'before-crash@example.test' });
    const pi = await h.stripe.paymentIntents.create({ amount: 6_000, currency: 'usd', customer: customer.id });
    // Copy the files as they are while it runs, as if the process had died here mid-write.
    const crashDir = mkdtempSync(path.join(tmpdir(), 'payments-fake-crash-'));
    cleanups.push(async () => rmSync(crashDir, { recursive: true, force: true }));
    const crashFile = path.join(crashDir, 'state.json');
    copyFileSync(h.dataFile, crashFile);
    copyFileSync(`${h.dataFile}.log`, `${crashFile}.log`);
    appendFileSync(`${crashFile}.log`, '{"c":[["customers","cus_half",{"id":"cus_ha');

    const revived = await started({ dataFile: crashFile });
    expect(await revived.stripe.customers.retrieve(customer.id)).toMatchObject({ email: 'before-crash@example.test' });
    expect((await revived.stripe.paymentIntents.retrieve(pi.id)).amount).toBe(6_000);
    expect((await revived.stripe.customers.list({ limit: 100 })).data.map((c) => c.id)).toEqual([customer.id]);
  });

  it('sends deliveries left unfinished once it is back', async () => {
    const port = await closedPort();
    // The first attempt fails and the next retry is far away, so the delivery is still owed at close.
    const h = await started({ webhookUrl: `http://127.0.0.1:${port}/hook`, webhookSecret: WEBHOOK_SECRET, webhookRetryDelaysMs: [60_000] });
    const customer = await h.stripe.customers.create({});
    const [evt] = (await h.stripe.events.list({ limit: 1 })).data;
    await new Promise((r) => setTimeout(r, 100));

    const receiver = await startReceiver();
    cleanups.push(() => receiver.close());
    await h.restart({ webhookUrl: receiver.url });
    await receiver.waitFor((r) => r.length === 1);
    expect(receiver.received[0].event.id).toBe(evt.id);
    expect((receiver.received[0].event.data.object as { id: string }).id).toBe(customer.id);
  });
});
