// Capital planning, framework-free: what a mitigation does to the model, what it costs, the paired
// (common random numbers) scenario estimator, and the best plan under a budget.
export * from './actions'
export * from './costs'
export * from './knapsack'
export * from './paired'
