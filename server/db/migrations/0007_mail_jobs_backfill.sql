-- Messages logged before mail went through jobs were queued when they were sent.
UPDATE mail_log SET queued_at = sent_at WHERE sent_at IS NOT NULL AND queued_at > sent_at;
