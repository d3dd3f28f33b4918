// Customer schemas.
import { describe, expect, it } from 'vitest';
import { customerInputSchema, customerUpdateSchema } from '@/lib/validation/customers';
import { fieldErrors, formDataToObject } from '@/lib/validation/form';

describe('customerInputSchema', () => {
  it('accepts a customer from a form, with the empty optional fields left out', () => {
    const form = new FormData();
    form.set('name', 'Marlow Street Bakery');
    form.set('email', 'orders@marlow-bakery.example');
    form.set('phone', '');
    form.set('notes', '   ');
    const parsed = customerInputSchema.parse(formDataToObject(form));
    expect(parsed).toEqual({ name: 'Marlow Street Bakery', email: 'orders@marlow-bakery.example', phone: '' });
  });

  it('names a missing name, a bad e-mail and letters in the phone', () => {
    const result = customerInputSchema.safeParse({ name: '', email: 'bakery', phone: 'call me' });
    expect(result.success).toBe(false);
    if (!result.success) expect(Object.keys(fieldErrors(result.error)).sort()).toEqual(['email', 'name', 'phone']);
  });

  it('accepts international phone notation', () => {
    expect(customerInputSchema.safeParse({ name: 'X', email: 'x@example.com', phone: '+44 (0)20 7946-0000' }).success).toBe(true);
  });
});

describe('customerUpdateSchema', () => {
  it('needs at least one field and checks the ones given', () => {
    expect(customerUpdateSchema.safeParse({}).success).toBe(false);
    expect(customerUpdateSchema.parse({ phone: '0123' })).toEqual({ phone: '0123' });
    expect(customerUpdateSchema.safeParse({ email: 'nope' }).success).toBe(false);
  });
});
