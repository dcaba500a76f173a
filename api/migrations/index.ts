import { Initial1764600000000 } from './1764600000000-initial';
import { Team1764700000000 } from './1764700000000-team';
import { Library1764800000000 } from './1764800000000-library';

/** Every migration, oldest first. */
export const MIGRATIONS = [Initial1764600000000, Team1764700000000, Library1764800000000];
