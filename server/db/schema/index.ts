export * from './lakes'
export * from './readings'
export * from './subscriptions'
export * from './users'
