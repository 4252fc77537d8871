// Marks the package's bin executable after tsc wrote it: tsc writes plain files, and `npx beadbook` (npm exec in
// this repository) runs the bin path directly, which a shell refuses without the executable bit.
import { chmodSync, readFileSync } from 'node:fs';
import { join } from 'node:path';

const root = join(import.meta.dirname, '..');
const { bin } = JSON.parse(readFileSync(join(root, 'package.json'), 'utf8'));
for (const path of Object.values(typeof bin === 'string' ? { bin } : bin)) chmodSync(join(root, path), 0o755);
