import { describe, expect, it } from 'vitest'
import type { PaymentState } from '../../shared/types/payment'
import { checkPaymentMove, paymentActionsFor, PAYMENT_SYSTEM } from '../../shared/utils/paymentStatus'

describe('the payment states', () => {
  it('moves only forward on the processor\'s word: a succeeded payment never goes back', () => {
    const to = (action: 'succeed' | 'fail' | 'refund', from: PaymentState) => {
      const check = checkPaymentMove(action, from, PAYMENT_SYSTEM)
      return check.ok ? check.to : check.statusCode
    }
    expect(to('succeed', 'pending')).toBe('succeeded')
    expect(to('succeed', 'failed')).toBe('succeeded')
    expect(to('fail', 'pending')).toBe('failed')
    expect(to('fail', 'succeeded')).toBe(409)
    expect(to('fail', 'refunded')).toBe(409)
    expect(to('succeed', 'refunded')).toBe(409)
    expect(to('refund', 'succeeded')).toBe('refunded')
    expect(to('refund', 'pending')).toBe(409)
    expect(to('refund', 'refunded')).toBe(409)
  })

  it('lets the processor\'s events alone say a payment succeeded or failed', () => {
    for (const side of ['payer', 'payee'] as const) {
      expect(checkPaymentMove('succeed', 'pending', { role: 'owner', side })).toMatchObject({ ok: false, statusCode: 403 })
      expect(checkPaymentMove('fail', 'pending', { role: 'owner', side })).toMatchObject({ ok: false, statusCode: 403 })
    }
  })

  it('shows Pay to the payer\'s owners while pending, and Refund to the payee\'s owners when it may be refunded', () => {
    expect(paymentActionsFor('pending', { role: 'owner', side: 'payer' }, false)).toEqual(['pay'])
    expect(paymentActionsFor('pending', { role: 'member', side: 'payer' }, false)).toEqual([])
    expect(paymentActionsFor('pending', { role: 'owner', side: 'payee' }, false)).toEqual([])
    expect(paymentActionsFor('succeeded', { role: 'owner', side: 'payee' }, true)).toEqual(['refund'])
    expect(paymentActionsFor('succeeded', { role: 'owner', side: 'payee' }, false)).toEqual([])
    expect(paymentActionsFor('succeeded', { role: 'owner', side: 'payer' }, true)).toEqual([])
    expect(paymentActionsFor('succeeded', { role: 'viewer', side: 'payee' }, true)).toEqual([])
  })
})
