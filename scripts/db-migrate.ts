import { migrateLatest } from './lib/database';

const url = process.env.DATABASE_URL ?? 'postgres://app@127.0.0.1:54329/lacewright';
migrateLatest(url).then(
  (applied) => console.log(applied.length ? `applied ${applied.length} migration(s)` : 'database is up to date'),
  (err) => {
    console.error(err);
    process.exit(1);
  },
);
