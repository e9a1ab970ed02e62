// An analysis-process entry for the pool tests: answers each job with this process's V8/Node flags, or
// fails the way the job asks (an uncaught exception, an exit code), or never answers.
process.on('disconnect', () => process.exit(0));
process.on('message', (m: { id: number; job: string }) => {
  if (m.job === 'throw') throw new RangeError('the test job asked for a crash');
  if (m.job === 'exit') process.exit(5);
  process.send?.({ id: m.id, outcome: { job: m.job, execArgv: process.execArgv, pid: process.pid, nan: NaN } });
});
