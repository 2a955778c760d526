import { pino, type Logger } from 'pino';

const root: Logger = pino({
  level: 'info',
  redact: { paths: ['password', 'secret', 'token', '*.password', '*.secret', '*.token', 'req.headers.authorization'], censor: '[redacted]' },
});
// Module loggers are made at import time, before the configuration is read: keep them to set their level later.
const children = new Map<string, Logger>();

export function configureLogger(level: string): Logger {
  root.level = level;
  for (const child of children.values()) child.level = level;
  return root;
}

export function logger(module: string): Logger {
  let child = children.get(module);
  if (!child) {
    child = root.child({ module });
    children.set(module, child);
  }
  return child;
}
