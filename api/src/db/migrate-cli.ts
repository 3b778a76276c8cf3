/** `npm run db:migrate` (up) and `npm run db:migrate -- down` (undo the last one). */
import { migrate, migrator } from './migrator';
import { sequelize } from './sequelize';

const direction = process.argv[2] ?? 'up';
if (direction === 'down') {
  const undone = await migrator.down();
  console.log(undone.length ? `undid ${undone.map((m) => m.name).join(', ')}` : 'nothing to undo');
} else {
  const applied = await migrate();
  console.log(applied.length ? `applied ${applied.join(', ')}` : 'database is up to date');
}
await sequelize.close();
