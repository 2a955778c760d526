// Every test file: quiet logs (tests assert on what users see, not on log lines).
import { configureLogger } from '../server/lib/logger';

configureLogger('silent');
