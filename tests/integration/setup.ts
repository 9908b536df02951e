import { loadTestEnv } from '../helpers/env';

loadTestEnv();
