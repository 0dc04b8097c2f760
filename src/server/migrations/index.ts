/**
 * Every committed migration, in order. Listed explicitly so the migrator never imports files
 * by path (which fails for .ts under vitest and after a build). Add new ones at the end.
 */
import { Migration20261201000000Foundation } from './Migration20261201000000Foundation';
import { Migration20261201100000Procedures } from './Migration20261201100000Procedures';
import { Migration20261201200000Jobs } from './Migration20261201200000Jobs';
import { Migration20261201400000Signoff } from './Migration20261201400000Signoff';
import { Migration20261201300000Parts } from './Migration20261201300000Parts';

export const migrationsList = [
  { name: 'Migration20261201000000Foundation', class: Migration20261201000000Foundation },
  { name: 'Migration20261201100000Procedures', class: Migration20261201100000Procedures },
  { name: 'Migration20261201200000Jobs', class: Migration20261201200000Jobs },
  { name: 'Migration20261201400000Signoff', class: Migration20261201400000Signoff },
  { name: 'Migration20261201300000Parts', class: Migration20261201300000Parts },
];
