import { identitySuite } from '../queue/identity-suite.js';

// Local pool vs the Redis queue with two and three `gridshake worker` processes (one in test/queue).
identitySuite([2, 3]);
