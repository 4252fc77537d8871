// The sync protocol shared by the device and the server. Versioned: see version.ts.
export * from './version.js';
export * from './errors.js';
export * from './canonical-json.js';
export * from './jwk.js';
export * from './jws.js';
export * from './jws-verify.js';
export * from './records.js';
export * from './batch.js';
export * from './device-key.js';
export * from './enrolment.js';
export * from './pull.js';
export * from './server-items.js';
export { sha256Hex, randomUuid } from './platform.js';
