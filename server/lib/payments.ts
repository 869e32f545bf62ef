import Stripe from 'stripe'

export type Payments = Stripe

export interface PaymentSettings {
  secretKey: string
  /** empty = the real service */
  host: string
  port: number
  protocol: 'http' | 'https'
}

/** The payment provider's SDK, pointed at the local fake or the real service by configuration only. */
export function createPayments(settings: PaymentSettings): Payments {
  return new Stripe(settings.secretKey, {
    maxNetworkRetries: 0,
    telemetry: false,
    ...(settings.host ? { host: settings.host, port: settings.port, protocol: settings.protocol } : {}),
  })
}
