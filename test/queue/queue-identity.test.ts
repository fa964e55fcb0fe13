import { identitySuite } from './identity-suite.js';

// Local pool vs the Redis queue with one `gridshake worker` process (2 and 3 in test/stress/queue-identity.test.ts).
identitySuite([1]);
