import { NextResponse, type NextRequest } from 'next/server';
import { env } from '@/lib/env';
import { clientAddress } from '@/lib/security/clientAddress';
import { contentSecurityPolicy, makeNonce, originOf } from '@/lib/security/contentSecurityPolicy';
import { consumeSignInLink, signInStanding, tooManyRequests } from '@/lib/security/limits';

// Runs before pages and the sign-in endpoints. Pages get a content security policy with a fresh script
// nonce (Next reads it from the request's policy header and puts it on its own scripts). The two sign-in
// doors answer 429 here once an account or address has used up its tries: e-mailed links are counted
// here, failed passwords where the outcome is known (lib/auth/options.ts). Access control is not done
// here: see lib/auth/guard.ts.

const PHOTO_UPLOAD_ORIGIN = originOf(env.S3_PUBLIC_ENDPOINT ?? env.S3_ENDPOINT);
const DEVELOPMENT = process.env.NODE_ENV === 'development';

async function formEmail(request: NextRequest): Promise<string> {
  try {
    const form = await request.clone().formData();
    const email = form.get('email');
    return typeof email === 'string' ? email : '';
  } catch {
    return '';
  }
}

async function signInThrottle(request: NextRequest): Promise<Response | null> {
  if (request.method !== 'POST') return null;
  const path = decodeURIComponent(request.nextUrl.pathname).replace(/\/+$/, '');
  const address = clientAddress(request.headers);
  const signInPage = new URL('/sign-in?error=TooManyAttempts', env.APP_URL).toString();
  if (path === '/api/auth/callback/password') {
    const standing = await signInStanding(await formEmail(request), address);
    // `url` is what next-auth's client reads from any answer of this endpoint.
    if (!standing.allowed) return tooManyRequests(standing, 'sign-in attempts', { url: signInPage });
  }
  if (path === '/api/auth/signin/email') {
    const standing = await consumeSignInLink(await formEmail(request), address);
    if (!standing.allowed) return tooManyRequests(standing, 'sign-in links requested', { url: signInPage });
  }
  return null;
}

export async function proxy(request: NextRequest) {
  if (request.nextUrl.pathname.startsWith('/api/')) return (await signInThrottle(request)) ?? NextResponse.next();

  const nonce = makeNonce();
  const policy = contentSecurityPolicy({ nonce, development: DEVELOPMENT, connectOrigins: PHOTO_UPLOAD_ORIGIN ? [PHOTO_UPLOAD_ORIGIN] : [] });
  const requestHeaders = new Headers(request.headers);
  requestHeaders.set('x-nonce', nonce);
  requestHeaders.set('content-security-policy', policy);
  const response = NextResponse.next({ request: { headers: requestHeaders } });
  response.headers.set('Content-Security-Policy', policy);
  return response;
}

export const config = {
  matcher: [
    '/api/auth/:path*',
    {
      // Pages only: not other API routes, build files, the icon, or prefetches (no scripts run from those).
      source: '/((?!api/|_next/static|_next/image|favicon.ico|fonts/).*)',
      missing: [
        { type: 'header', key: 'next-router-prefetch' },
        { type: 'header', key: 'purpose', value: 'prefetch' },
      ],
    },
  ],
};
