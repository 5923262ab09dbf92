// Runs a TypeScript worker under tsx in development and tests (../shared/STACK-NOTES.md #7: a
// worker given a .ts file fails with ERR_UNKNOWN_FILE_EXTENSION, also with --import tsx).
// The pool passes the .ts worker's file URL as workerData.tsWorker; its default export is the handler.
import { workerData } from 'piscina';
import { register } from 'tsx/esm/api';

register();
const mod = await import(workerData.tsWorker);
export default mod.default;
