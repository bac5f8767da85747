import { migrate } from './lib/migrate';

const url = process.env.DATABASE_URL;
if (!url) {
  console.error('DATABASE_URL is not set');
  process.exit(1);
}
const direction = process.argv[2] === 'down' ? 'rollback-all' : 'latest';
migrate(url, direction).then(
  (names) => console.log(names.length ? `${direction}: ${names.join(', ')}` : 'Already up to date'),
  (err) => {
    console.error(err);
    process.exit(1);
  },
);
