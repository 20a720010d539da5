/** A unit setting and its choices. */
export interface UnitChoice {
  key: 'temperature' | 'length' | 'speed' | 'clock'
  label: string
  options: { value: string; label: string }[]
}
/** The unit settings and their choices, for the account's settings and the morning brief's. */
export const UNIT_CHOICES: UnitChoice[] = [
  {
    key: 'temperature',
    label: 'Temperature',
    options: [
      { value: 'F', label: '°F' },
      { value: 'C', label: '°C' },
    ],
  },
  {
    key: 'length',
    label: 'Depth and level',
    options: [
      { value: 'ft', label: 'feet' },
      { value: 'm', label: 'metres' },
    ],
  },
  {
    key: 'speed',
    label: 'Wind',
    options: [
      { value: 'mph', label: 'mph' },
      { value: 'kmh', label: 'km/h' },
      { value: 'knots', label: 'knots' },
    ],
  },
  {
    key: 'clock',
    label: 'Clock',
    options: [
      { value: '12h', label: '12-hour' },
      { value: '24h', label: '24-hour' },
    ],
  },
]
