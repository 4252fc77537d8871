import { expose } from 'comlink';
import { importApi } from './import-api.js';

expose(importApi);
