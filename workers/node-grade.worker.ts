// The same grading API behind a Node worker thread, for the command line and for tests across a real boundary.
import { parentPort } from 'node:worker_threads';
import { expose } from 'comlink';
import nodeEndpoint from 'comlink/dist/esm/node-adapter.mjs';
import { gradeApi } from './grade-api.js';

if (!parentPort) throw new Error('node-grade.worker must run in a worker thread');
expose(gradeApi, nodeEndpoint(parentPort));
