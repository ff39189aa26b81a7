// Insurance terms and pricing on simulated loss events (framework-free).
export * from './terms'
export * from './pricing'
export * from './financials'
export * from './layers'
