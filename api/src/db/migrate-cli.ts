/** `npm run db:migrate` (up) and `npm run db:migrate -- down` (undo the last one), as the owner role. */
import { migrate, undoLastMigration } from './migrator';

const direction = process.argv[2] ?? 'up';
if (direction === 'down') {
  const undone = await undoLastMigration();
  console.log(undone.length ? `undid ${undone.join(', ')}` : 'nothing to undo');
} else {
  const applied = await migrate();
  console.log(applied.length ? `applied ${applied.join(', ')}` : 'database is up to date');
}
