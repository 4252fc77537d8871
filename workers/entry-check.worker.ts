import { expose } from 'comlink';
import { createEntryCheckApi } from './entry-check-api.js';

// One copy of the seam on the Gauge screen per worker; the page starts one worker for the session.
expose(createEntryCheckApi());
