// Who may do what: every API route and method against six principals, with the status each must get.
// Rider A owns the requests and jobs; shop X (builder X) bid on them and builds them; rider B and shop Y
// are strangers to them; the admin sees everything but writes only where admins do. A route or method
// that is missing here fails the matrix test, so a new route has to be added with its answers.
import type { Principal } from './authz-matrix.fixtures';
import type { World } from './authz-matrix.fixtures';
import type { Visitor } from '../support/http';

export type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
export type Subject = Record<string, string>;

export interface MatrixContext {
  world: World;
  visitors: Record<Principal, Visitor>;
  /** A value no other call in the run uses. */
  unique: (prefix: string) => string;
}

export interface MatrixCase {
  /** The route as its folder names it, e.g. /api/requests/[id]. */
  route: string;
  method: Method;
  /** What is being tried, for the failure message. */
  about: string;
  /** Makes what the call acts on; shared by the principals expected to be refused. */
  subject?: (c: MatrixContext) => Promise<Subject>;
  /** The call changes its subject: each principal expected to succeed gets a fresh one. */
  fresh?: boolean;
  path: (s: Subject) => string;
  body?: (s: Subject, c: MatrixContext) => unknown;
  /** For endpoints that take a form or need a token first. */
  send?: (v: Visitor, s: Subject, c: MatrixContext) => Promise<Response>;
  expect: Record<Principal, number>;
}

/** Expected statuses in principal order: anonymous, rider A, rider B, builder X, builder Y, admin. */
function s(anonymous: number, riderA: number, riderB: number, builderX: number, builderY: number, admin: number): Record<Principal, number> {
  return { anonymous, riderA, riderB, builderX, builderY, admin };
}

const everyone = (status: number) => s(status, status, status, status, status, status);
const adminOnly = s(401, 403, 403, 403, 403, 200);
const signedIn = s(401, 200, 200, 200, 200, 200);
const buildersOnly = s(401, 403, 403, 200, 200, 403);

const inDays = (n: number) => new Date(Date.now() + n * 86_400_000).toISOString().slice(0, 10);
const validBid = { partsCents: 31_000, labourCents: 16_000, finishCents: 5_000, shippingCents: 4_000, leadTimeDays: 20, validUntil: inDays(10), message: 'Matrix bid.' };
const requestBody = {
  title: 'Matrix request: 26-inch rear',
  wheels: [{ position: 'rear', nominalDiameterIn: 26, rimWidthMm: 80, tireWidthMm: 76, spokes: 72, spokeGauge: 12, lacing: { kind: 'cross', crosses: 3 }, hubId: 'rear-igh3-coaster-120', finish: 'polished' }],
  frame: { rearSpacingMm: 120, frontSpacingMm: 100, bbShellWidthMm: 68, bbShellType: 'threaded' },
  zip: '87102',
  delivery: 'ship',
  neededBy: inDays(60),
  budgetCents: 60_000,
  notes: '',
};
export const FIT_BODY = {
  position: 'rear',
  nominalDiameterIn: 26,
  rimWidthMm: 80,
  tireWidthMm: 76,
  spokes: 72,
  spokeGauge: 12,
  crosses: 3,
  hubId: 'rear-igh3-coaster-120',
  frameRearSpacingMm: 120,
  forkSpacingMm: 100,
  bbShellWidthMm: 68,
  finish: 'polished',
};

// Subjects, each made once per run unless a case is fresh.
const openWithBid = (c: MatrixContext) => c.world.requestWithBid();
const draft = async (c: MatrixContext) => ({ requestId: (await c.world.draftRequest()).id });
const awaitingJob = async (c: MatrixContext) => {
  await c.world.ensurePayouts(); // so paying is possible
  return c.world.acceptedJob();
};
const fundedJob = (c: MatrixContext) => c.world.fundedJob();
const buildingJob = (c: MatrixContext) => c.world.buildingJob();
const shippedJob = (c: MatrixContext) => c.world.shippedJob();
const disputedJob = (c: MatrixContext) => c.world.disputedJob();
const completedJob = (c: MatrixContext) => c.world.completedJob();
const shops = async (c: MatrixContext) => {
  const rows = await c.world.db('shops').whereIn('id', [c.world.users.builderX.shopId, c.world.users.builderY.shopId]).select('id', 'slug');
  return { slugX: rows.find((r) => r.id === c.world.users.builderX.shopId).slug, slugY: rows.find((r) => r.id === c.world.users.builderY.shopId).slug };
};
const photo = async (c: MatrixContext) => {
  const { requestId } = await c.world.requestWithBid();
  const { uploadRequestPhoto } = await import('./authz-matrix.fixtures');
  return { requestId, uploadId: await uploadRequestPhoto(c.visitors.riderA, requestId) };
};
const riderReview = async (c: MatrixContext) => {
  const { jobId } = await c.world.completedJob();
  const res = await c.visitors.riderA.request('/api/reviews', { method: 'POST', json: { jobId, side: 'rider', overall: 5, aspects: { buildQuality: 5, communication: 4, onTime: 5 }, text: 'True and round.' } });
  if (res.status !== 201) throw new Error(`review answered ${res.status}: ${await res.text()}`);
  return { jobId, reviewId: ((await res.json()) as { id: string }).id };
};

async function credentialsPost(v: Visitor, c: MatrixContext): Promise<Response> {
  const csrfToken = await v.csrfToken();
  // A wrong password from an address of its own, so these tries count against nobody else.
  return v.request('/api/auth/callback/password', {
    method: 'POST',
    headers: { 'x-forwarded-for': '198.51.100.200' },
    form: { csrfToken, email: `${c.unique('nobody')}@example.test`, password: 'not the password', json: 'true' },
  });
}

export const MATRIX: MatrixCase[] = [
  // Accounts and sessions
  {
    route: '/api/accounts',
    method: 'POST',
    about: 'sign up',
    path: () => '/api/accounts',
    body: (_, c) => ({ role: 'rider', name: 'Matrix Rider', email: `${c.unique('matrix')}@example.test`, password: 'ten chars or more' }),
    expect: everyone(201),
  },
  { route: '/api/me', method: 'GET', about: 'who am I', path: () => '/api/me', expect: signedIn },
  { route: '/api/auth/[...nextauth]', method: 'GET', about: 'the session', path: () => '/api/auth/session', expect: everyone(200) },
  { route: '/api/auth/[...nextauth]', method: 'POST', about: 'a wrong password', path: () => '/api/auth/callback/password', send: (v, _, c) => credentialsPost(v, c), expect: everyone(401) },
  { route: '/api/health', method: 'GET', about: 'health', path: () => '/api/health', expect: everyone(200) },
  { route: '/api/fit', method: 'POST', about: 'the fit check', path: () => '/api/fit', body: () => FIT_BODY, expect: everyone(200) },
  { route: '/api/tiles/[z]/[x]/[y]', method: 'GET', about: 'a map tile', path: () => '/api/tiles/4/3/6.png', expect: everyone(200) },

  // Requests
  { route: '/api/requests', method: 'GET', about: 'my requests', path: () => '/api/requests', expect: s(401, 200, 200, 403, 403, 200) },
  { route: '/api/requests', method: 'POST', about: 'post a request', path: () => '/api/requests', body: () => requestBody, expect: s(401, 201, 201, 403, 403, 403) },
  { route: '/api/requests/[id]', method: 'GET', about: "rider A's open request", subject: openWithBid, path: (x) => `/api/requests/${x.requestId}`, expect: s(401, 200, 404, 200, 200, 200) },
  { route: '/api/requests/[id]', method: 'GET', about: "rider A's draft", subject: draft, path: (x) => `/api/requests/${x.requestId}`, expect: s(401, 200, 404, 404, 404, 200) },
  { route: '/api/requests/[id]', method: 'PATCH', about: "change rider A's draft", subject: draft, path: (x) => `/api/requests/${x.requestId}`, body: () => requestBody, expect: s(401, 200, 404, 403, 403, 403) },
  { route: '/api/requests/[id]/publish', method: 'POST', about: "publish rider A's draft", subject: draft, fresh: true, path: (x) => `/api/requests/${x.requestId}/publish`, expect: s(401, 200, 404, 403, 403, 403) },
  { route: '/api/requests/[id]/cancel', method: 'POST', about: "cancel rider A's request", subject: openWithBid, fresh: true, path: (x) => `/api/requests/${x.requestId}/cancel`, expect: s(401, 200, 404, 403, 403, 403) },
  { route: '/api/requests/[id]/compare', method: 'GET', about: 'compare the bids', subject: openWithBid, path: (x) => `/api/requests/${x.requestId}/compare`, expect: s(401, 200, 404, 403, 403, 200) },
  {
    route: '/api/requests/[id]/accept',
    method: 'POST',
    about: "accept shop X's bid",
    subject: openWithBid,
    fresh: true,
    path: (x) => `/api/requests/${x.requestId}/accept`,
    body: (x) => ({ bidId: x.bidId }),
    expect: s(401, 200, 404, 403, 403, 403),
  },
  {
    route: '/api/requests/[id]/bids',
    method: 'POST',
    about: "bid on rider A's open request",
    subject: async (c) => ({ requestId: (await c.world.openRequest()).id }),
    fresh: true,
    path: (x) => `/api/requests/${x.requestId}/bids`,
    body: () => validBid,
    expect: s(401, 403, 403, 201, 201, 403),
  },
  { route: '/api/requests/[id]/threads', method: 'GET', about: "the request's conversations", subject: openWithBid, path: (x) => `/api/requests/${x.requestId}/threads`, expect: s(401, 200, 404, 200, 200, 200) },
  {
    route: '/api/requests/[id]/threads/[shopId]/messages',
    method: 'GET',
    about: "shop X's conversation",
    subject: openWithBid,
    path: (x) => `/api/requests/${x.requestId}/threads/${x.shopId}/messages`,
    expect: s(401, 200, 404, 200, 404, 200),
  },
  {
    route: '/api/requests/[id]/threads/[shopId]/messages',
    method: 'POST',
    about: "write in shop X's conversation",
    subject: openWithBid,
    path: (x) => `/api/requests/${x.requestId}/threads/${x.shopId}/messages`,
    body: () => ({ body: 'A matrix message.' }),
    expect: s(401, 201, 404, 201, 404, 403),
  },

  // Bids
  { route: '/api/bids', method: 'GET', about: "my shop's bids", path: () => '/api/bids', expect: buildersOnly },
  { route: '/api/board', method: 'GET', about: 'the board', path: () => '/api/board', expect: buildersOnly },
  { route: '/api/bids/[id]', method: 'PATCH', about: "revise shop X's bid", subject: openWithBid, path: (x) => `/api/bids/${x.bidId}`, body: () => validBid, expect: s(401, 403, 403, 200, 404, 403) },
  { route: '/api/bids/[id]/withdraw', method: 'POST', about: "withdraw shop X's bid", subject: openWithBid, fresh: true, path: (x) => `/api/bids/${x.bidId}/withdraw`, expect: s(401, 403, 403, 200, 404, 403) },

  // Jobs and money
  { route: '/api/jobs', method: 'GET', about: 'my jobs', path: () => '/api/jobs', expect: signedIn },
  { route: '/api/jobs/[id]', method: 'GET', about: 'the job', subject: awaitingJob, path: (x) => `/api/jobs/${x.jobId}`, expect: s(401, 200, 404, 200, 404, 200) },
  { route: '/api/jobs/[id]/pay', method: 'POST', about: 'pay into escrow', subject: awaitingJob, path: (x) => `/api/jobs/${x.jobId}/pay`, expect: s(401, 200, 404, 403, 403, 403) },
  { route: '/api/jobs/[id]/cancel', method: 'POST', about: 'cancel before payment', subject: awaitingJob, fresh: true, path: (x) => `/api/jobs/${x.jobId}/cancel`, body: () => ({ reason: 'Matrix.' }), expect: s(401, 200, 404, 200, 404, 403) },
  { route: '/api/jobs/[id]/start', method: 'POST', about: 'start the build', subject: fundedJob, fresh: true, path: (x) => `/api/jobs/${x.jobId}/start`, expect: s(401, 403, 403, 200, 404, 403) },
  {
    route: '/api/jobs/[id]/ship',
    method: 'POST',
    about: 'hand the wheel over',
    subject: buildingJob,
    fresh: true,
    path: (x) => `/api/jobs/${x.jobId}/ship`,
    body: () => ({ handover: 'pickup' }),
    expect: s(401, 403, 403, 200, 404, 403),
  },
  { route: '/api/jobs/[id]/confirm', method: 'POST', about: 'confirm receipt', subject: shippedJob, fresh: true, path: (x) => `/api/jobs/${x.jobId}/confirm`, expect: s(401, 200, 404, 403, 403, 403) },
  {
    route: '/api/jobs/[id]/dispute',
    method: 'POST',
    about: 'open a dispute',
    subject: shippedJob,
    fresh: true,
    path: (x) => `/api/jobs/${x.jobId}/dispute`,
    body: () => ({ reason: 'damaged', details: 'The rim arrived with a flat spot near the valve hole.' }),
    expect: s(401, 200, 404, 200, 404, 403),
  },
  {
    route: '/api/jobs/[id]/dispute/notes',
    method: 'POST',
    about: "add to the dispute's thread",
    subject: disputedJob,
    path: (x) => `/api/jobs/${x.jobId}/dispute/notes`,
    body: () => ({ body: 'A matrix note.' }),
    expect: s(401, 200, 404, 200, 404, 200),
  },
  { route: '/api/payments/webhook', method: 'POST', about: 'an unsigned event', path: () => '/api/payments/webhook', body: () => ({ id: 'evt_matrix', type: 'payment_intent.succeeded' }), expect: everyone(400) },
  { route: '/api/shop/payouts', method: 'GET', about: 'payout status', path: () => '/api/shop/payouts', expect: buildersOnly },
  { route: '/api/shop/payouts', method: 'POST', about: 'a payout setup link', path: () => '/api/shop/payouts', expect: buildersOnly },

  // Admin
  { route: '/api/admin/audit', method: 'GET', about: 'the audit log', path: () => '/api/admin/audit', expect: adminOnly },
  { route: '/api/admin/disputes', method: 'GET', about: 'the disputes queue', path: () => '/api/admin/disputes', expect: adminOnly },
  { route: '/api/admin/disputes/[id]', method: 'GET', about: 'one dispute', subject: disputedJob, path: (x) => `/api/admin/disputes/${x.disputeId}`, expect: adminOnly },
  {
    route: '/api/admin/disputes/[id]/resolve',
    method: 'POST',
    about: 'settle a dispute',
    subject: disputedJob,
    fresh: true,
    path: (x) => `/api/admin/disputes/${x.disputeId}/resolve`,
    body: () => ({ resolution: 'release', reason: 'The photos show the rim as agreed in the bid.' }),
    expect: adminOnly,
  },
  { route: '/api/admin/ledger', method: 'GET', about: 'the ledger', path: () => '/api/admin/ledger', expect: adminOnly },
  { route: '/api/admin/ledger/export', method: 'GET', about: 'the ledger as CSV', path: () => '/api/admin/ledger/export', expect: adminOnly },
  { route: '/api/admin/mailbox', method: 'GET', about: 'the demo mailbox', path: () => '/api/admin/mailbox', expect: adminOnly },

  // Shops
  { route: '/api/shop', method: 'GET', about: 'my shop', path: () => '/api/shop', expect: buildersOnly },
  { route: '/api/shop/settings', method: 'GET', about: "my shop's settings", path: () => '/api/shop/settings', expect: buildersOnly },
  { route: '/api/shop/settings', method: 'PATCH', about: "change my shop's settings (to what they are)", path: () => '/api/shop/settings', body: () => ({}), expect: buildersOnly },
  { route: '/api/shops/[slug]', method: 'GET', about: "shop X's profile", subject: shops, path: (x) => `/api/shops/${x.slugX}`, expect: everyone(200) },
  {
    route: '/api/shops/[slug]/invitations',
    method: 'POST',
    about: "invite a shop to rider A's request",
    subject: async (c) => {
      const requestId = (await c.world.openRequest()).id;
      // Publishing already invites the shops that match; pick one that was not.
      const invited = c.world.db('shop_invitations').where({ request_id: requestId }).select('shop_id');
      const shop = await c.world.db('shops').whereNotIn('id', invited).orderBy('slug').first('slug');
      return { requestId, slug: shop.slug };
    },
    fresh: true,
    path: (x) => `/api/shops/${x.slug}/invitations`,
    body: (x) => ({ requestId: x.requestId }),
    expect: s(401, 201, 404, 403, 403, 403),
  },

  // Photos
  {
    route: '/api/uploads',
    method: 'POST',
    about: "start a photo for rider A's request",
    subject: openWithBid,
    path: () => '/api/uploads',
    body: (x) => ({ purpose: 'request_photo', subjectId: x.requestId, fileName: 'frame.png', contentType: 'image/png', bytes: 1000 }),
    expect: s(401, 201, 403, 403, 403, 403),
  },
  { route: '/api/uploads', method: 'GET', about: "rider A's request photos", subject: photo, path: (x) => `/api/uploads?purpose=request_photo&subjectId=${x.requestId}`, expect: s(404, 200, 404, 200, 200, 200) },
  { route: '/api/uploads/[id]/image', method: 'GET', about: "a photo of rider A's open request", subject: photo, path: (x) => `/api/uploads/${x.uploadId}/image`, expect: s(404, 200, 404, 200, 200, 200) },
  { route: '/api/uploads/[id]/thumb', method: 'GET', about: 'its thumbnail', subject: photo, path: (x) => `/api/uploads/${x.uploadId}/thumb`, expect: s(404, 200, 404, 200, 200, 200) },
  { route: '/api/uploads/[id]/finalize', method: 'POST', about: 'finish the upload again', subject: photo, path: (x) => `/api/uploads/${x.uploadId}/finalize`, expect: s(401, 200, 403, 403, 403, 403) },
  { route: '/api/uploads/[id]', method: 'DELETE', about: 'remove the photo', subject: photo, fresh: true, path: (x) => `/api/uploads/${x.uploadId}`, expect: s(401, 200, 403, 403, 403, 403) },

  // Reviews
  { route: '/api/reviews', method: 'GET', about: "the job's reviews", subject: riderReview, path: (x) => `/api/reviews?jobId=${x.jobId}`, expect: s(401, 200, 404, 200, 404, 200) },
  {
    route: '/api/reviews',
    method: 'POST',
    about: 'review a completed job',
    subject: completedJob,
    fresh: true,
    path: () => '/api/reviews',
    body: (x) => ({ jobId: x.jobId, side: 'rider', overall: 4, aspects: { buildQuality: 4, communication: 4, onTime: 4 }, text: 'Good wheel.' }),
    expect: s(401, 201, 404, 403, 404, 403),
  },
  { route: '/api/reviews/[id]', method: 'PATCH', about: "change rider A's review", subject: riderReview, path: (x) => `/api/reviews/${x.reviewId}`, body: () => ({ overall: 4 }), expect: s(401, 200, 404, 403, 404, 403) },
];
