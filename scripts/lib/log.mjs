// Progress lines for the bootstrap scripts: one prefix, so a person can follow what happens.
export const say = (msg) => console.log(`\x1b[36m[torquetrail]\x1b[0m ${msg}`);
export const fail = (msg) => {
  console.error(`\x1b[31m[torquetrail]\x1b[0m ${msg}`);
};
