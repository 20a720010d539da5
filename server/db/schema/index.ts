export * from './lakes'
export * from './readings'
export * from './users'
