// Seed steps of modules beyond the foundation register themselves here (import for side effects).
// The price book and demo orders come first: later steps (plans, runs, certificates, invoices) build on the orders.
import '../modules/orders/orders.seed.ts'
// approved fill plans for the orders already at 'planned' / 'filling' (the runs seed books cylinders for them)
import '../modules/plans/plans.seed.ts'
// fill runs: books cylinders for approved plans, so keep it after the plans seed
import '../modules/runs/runs.seed.ts'
