// Registers every domain's demo seeder, in dependency order. Import this module for its effect.
import { seeders } from './index'

void seeders
