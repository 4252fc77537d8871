export { assessSeam } from './assess-seam.js';
export type { AssessOptions } from './setup.js';
export type * from './types.js';
