// The invented demo plans, shared by the seed and the tests.
export { demoPlans } from '@/tests/fixtures/plans';
