// Node's flags for the service's process, as `npm start` runs it (package.json) and as the bench starts it.
// A young generation of 32 MB per semi-space in place of V8's 16: at half the bare ceiling the service makes
// about 17,000 messages' worth of short-lived objects a second (packets, parsed payloads, batch items), and
// with the larger nursery far fewer of them live long enough to be copied. Profiled at 17,000 msg/s: the
// garbage collector's time on the service's thread fell from about 4.1 s to 1.6 s a minute (README, Performance).
// The flag must be given on the command line: set at run time (v8.setFlagsFromString) it does not take effect.
export const SERVICE_NODE_FLAGS = ['--max-semi-space-size=32'];
