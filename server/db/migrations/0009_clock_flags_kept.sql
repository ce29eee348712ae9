-- Clock events stored before the server judged phones' clocks: a time before the call was taken or
-- after the server learned of it (five minutes of skew either side) is flagged, kept, never billed.
UPDATE "clock_events" e SET "flag" = CASE WHEN e."device_at" < c."received_at" - interval '5 minutes' THEN 'before_call' ELSE 'future' END
FROM "calls" c
WHERE c."id" = e."call_id" AND e."flag" IS NULL AND e."device_at" IS NOT NULL
  AND (e."device_at" < c."received_at" - interval '5 minutes' OR e."device_at" > e."created_at" + interval '5 minutes');
