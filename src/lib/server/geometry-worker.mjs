// Entry of a geometry worker thread. tsx (a runtime dependency) compiles the TypeScript tasks, so
// the same file serves under Vite, vitest and the built app, which finds it by its place in the
// project (see geometry-pool.ts).
import { register } from 'tsx/esm/api';

register();
const { runGeometryJob } = await import('./geometry-tasks.ts');

export default runGeometryJob;
