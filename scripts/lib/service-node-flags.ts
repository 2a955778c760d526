// Node's flags for the service's process, as `npm start` runs it (package.json) and as the bench starts it.
// A young generation of 8 MB per semi-space in place of V8's 16, for the service's thread and the broker's
// (a process-wide V8 flag sets both: a worker's own resourceLimits do not override it). The broker's socket
// work runs on a thread of its own (broker/threaded-broker.ts), and each thread has a young generation of
// its own: at V8's default the two held about 50 MB between them at 10,000 units and the process's peak RSS
// came to 392-403 MB, at 8 MB 373 MB, with the board's latency at half the ceiling alike within the
// machine's noise (README, Performance).
// The flag must be given on the command line: set at run time (v8.setFlagsFromString) it does not take effect.
export const SERVICE_NODE_FLAGS = ['--max-semi-space-size=8'];
