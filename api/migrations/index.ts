import { Initial1764600000000 } from './1764600000000-initial';

/** Every migration, oldest first. */
export const MIGRATIONS = [Initial1764600000000];
