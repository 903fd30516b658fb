// Settings for the local payments stand-in, shared by the app's settings and the start command.
// Test-mode values only; a real deployment sets its own through the environment.
export const LOCAL_PAYMENTS = {
  apiHost: '127.0.0.1',
  apiPort: 12111,
  secretKey: 'sk_test_lacewright_local',
  webhookSecret: 'whsec_lacewright_local_webhook_secret',
} as const;
