// Loaded with `node --require` by bench/cli-startup.mjs: print the process's CPU time (user + system,
// milliseconds, start-up included) on stderr as it ends, for the bench to read.
process.on('exit', () => {
  const u = process.cpuUsage();
  require('node:fs').writeSync(2, `\ncpu-at-exit ${((u.user + u.system) / 1000).toFixed(1)}\n`);
});
