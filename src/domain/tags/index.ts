export * from './tag-text.js';
export * from './linking.js';
