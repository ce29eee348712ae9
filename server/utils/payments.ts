import Stripe from 'stripe'

let stripe: Stripe | undefined

/** The payment SDK, pointed at the configured host (the local fake unless set otherwise). */
export function useStripe(): Stripe {
  if (!stripe) {
    const c = useRuntimeConfig()
    stripe = new Stripe(c.stripeSecretKey, {
      host: c.stripeApiHost, port: Number(c.stripeApiPort), protocol: c.stripeApiProtocol as 'http' | 'https',
      maxNetworkRetries: 1, telemetry: false, timeout: 15_000,
    })
  }
  return stripe
}
