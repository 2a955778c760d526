import { pino, type Logger } from 'pino';

let root: Logger = pino({
  level: 'info',
  redact: { paths: ['password', 'secret', 'token', '*.password', '*.secret', '*.token', 'req.headers.authorization'], censor: '[redacted]' },
});

export function configureLogger(level: string): Logger {
  root = root.child({}, { level });
  root.level = level;
  return root;
}

export const logger = (module: string): Logger => root.child({ module });
export const rootLogger = () => root;
