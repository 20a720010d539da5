import { pgEnum, pgTable, uuid } from 'drizzle-orm/pg-core'
import { timestamps } from './columns'
import { lakes } from './lakes'
import { users } from './users'

export const temperatureUnit = pgEnum('temperature_unit', ['F', 'C'])
export const lengthUnit = pgEnum('length_unit', ['ft', 'm'])
export const speedUnit = pgEnum('speed_unit', ['mph', 'kmh', 'knots'])
export const clockStyle = pgEnum('clock_style', ['12h', '24h'])

/** One row per user who has changed a setting; others get the defaults. */
export const userSettings = pgTable('user_settings', {
  userId: uuid()
    .primaryKey()
    .references(() => users.id, { onDelete: 'cascade' }),
  temperature: temperatureUnit().notNull().default('F'),
  length: lengthUnit().notNull().default('ft'),
  speed: speedUnit().notNull().default('mph'),
  clock: clockStyle().notNull().default('12h'),
  homeLakeId: uuid().references(() => lakes.id, { onDelete: 'set null' }),
  ...timestamps,
})
