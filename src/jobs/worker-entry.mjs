// Entry of a worker thread: loads the TypeScript task runner through tsx, so workers run the same sources under
// `npm start` (tsx), vitest and the CLI. tsImport scopes tsx to this import and does not clash with a loader that
// the parent process already registered.
import { tsImport } from 'tsx/esm/api';

const loaded = tsImport('./run-task.ts', import.meta.url);
// a failed load is reported by the first task that awaits it, not as an unhandled rejection that ends the thread
loaded.catch(() => {});

export default async function runTask(task) {
  const module = await loaded;
  return module.default(task);
}
