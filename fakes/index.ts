import { startPaymentsFake } from './payments/server.ts'
import { startSmtpFake } from './smtp/server.ts'

export { startPaymentsFake, startSmtpFake }

/** Starts both local fakes (used by `npm start` when START_FAKES=true). */
export async function startFakes(options: { smtpPort: number; smtpWebPort: number; paymentsPort: number; appUrl: string; webhookSecret: string }) {
  const smtp = await startSmtpFake({ smtpPort: options.smtpPort, webPort: options.smtpWebPort })
  const payments = await startPaymentsFake({
    port: options.paymentsPort,
    webhookUrl: `${options.appUrl}/api/payments/webhook`,
    webhookSecret: options.webhookSecret,
    publicUrl: options.appUrl,
  })
  return {
    smtp,
    payments,
    close: async () => {
      await Promise.all([smtp.close(), payments.close()])
    },
  }
}
