/**
 * Every committed migration, in order. Listed explicitly so the migrator never imports files
 * by path (which fails for .ts under vitest and after a build). Add new ones at the end.
 */
import { Migration20261201000000Foundation } from './Migration20261201000000Foundation';

export const migrationsList = [
  { name: 'Migration20261201000000Foundation', class: Migration20261201000000Foundation },
];
