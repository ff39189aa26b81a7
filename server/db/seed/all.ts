// Registers every domain's demo seeder, in dependency order. Import this module for its effect.
import { assumptionsSeeder } from './assumptions'
import { seeders } from './index'

seeders.push(assumptionsSeeder)
