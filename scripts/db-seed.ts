import { seedDemo } from './lib/database';

const url = process.env.DATABASE_URL ?? 'postgres://app@127.0.0.1:54329/lacewright';
seedDemo(url).then(
  () => console.log('demo data is in place'),
  (err) => {
    console.error(err);
    process.exit(1);
  },
);
