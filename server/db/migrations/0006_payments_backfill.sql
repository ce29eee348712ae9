-- Invoices paid before payments were summed on the invoice: their payments count in full.
UPDATE invoices SET paid_cents = p.sum
FROM (SELECT invoice_id, sum(amount_cents)::int AS sum FROM payments GROUP BY invoice_id) p
WHERE p.invoice_id = invoices.id;
