/** Loopback ports for the test run's own services (the same helpers `npm start` and the cluster use). */
export { freePort, portIsFree } from '@/server/ops/ports';
