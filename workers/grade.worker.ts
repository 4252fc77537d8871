import { expose } from 'comlink';
import { gradeApi } from './grade-api.js';

expose(gradeApi);
