// Worker-thread entry: load the TypeScript worker through tsx, as bin/crestline.js does for the CLI.
import { register } from 'tsx/esm/api';

register();
await import('./laneWorker.ts');
