export * from './fits.js';
export * from './extract.js';
export * from './profile-import.js';
