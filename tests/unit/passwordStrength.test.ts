import { describe, expect, it } from 'vitest'
import { passwordProblem } from '../../shared/utils/passwordStrength'
import { userCreateSchema } from '../../shared/schemas/users'

// The judge is zxcvbn (@zxcvbn-ts/core) with the common-password list of @zxcvbn-ts/language-common:
// these checks hold Wayside's rule to that outside estimator, not to a list of its own.
describe('new passwords', () => {
  it('refuses anything under ten characters, first', () => {
    expect(passwordProblem('Tr4ck!9x')).toBe('Use at least 10 characters')
  })

  it('refuses passwords from the common-password list and keyboard runs, saying why', () => {
    expect(passwordProblem('password123')).toMatch(/^Too easy to guess: .*commonly used password/)
    expect(passwordProblem('1234567890')).toMatch(/^Too easy to guess/)
    expect(passwordProblem('qwertyuiop')).toMatch(/^Too easy to guess/)
    expect(passwordProblem('zzzzzzzzzzzz')).toMatch(/repeated characters/)
  })

  it('tells a person why the demo password is weak (it is seeded directly, never through this rule)', () => {
    expect(passwordProblem('wayside-demo')).toMatch(/tied to Wayside/)
  })

  it('refuses the person\'s own name or e-mail as a password', () => {
    expect(passwordProblem('harlanmcbride', ['Harlan McBride', 'harlan@fleet.example'])).toMatch(/tied to Wayside or to this person/)
  })

  it('takes a few unrelated words (xkcd 936, "correct horse battery staple")', () => {
    expect(passwordProblem('correct horse battery staple')).toBeNull()
    expect(passwordProblem('copper lantern meadow')).toBeNull()
  })

  it('shows the reason beside the password box: the form\'s schema names the field', () => {
    const r = userCreateSchema.safeParse({ email: 'new@wayside.test', name: 'New Person', role: 'office', password: 'wayside-demo' })
    expect(r.success).toBe(false)
    expect(r.error?.issues[0]?.path).toEqual(['password'])
  })
})
