// Registers every domain's demo seeder, in dependency order. Import this module for its effect.
import { accountsSeeder } from './accounts'
import { assumptionsSeeder } from './assumptions'
import { seeders } from './index'
import { seedInventory } from './inventory'
import { insuranceSeeder } from './insurance'

seeders.push(accountsSeeder)
seeders.push({ name: 'inventory', run: seedInventory })
seeders.push(assumptionsSeeder)
seeders.push(insuranceSeeder)
