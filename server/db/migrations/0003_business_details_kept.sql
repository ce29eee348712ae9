-- Rates set before the business details moved into them printed these on every invoice; keep them.
UPDATE rates SET business_name = 'Two Rivers Road Service', remit_address = '14 Quarry Spur, Harrow Bend'
WHERE business_name = '' AND remit_address = '';
