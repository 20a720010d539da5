-- Change notices: each app process keeps hot answers (sessions, Lake reads, Day plans) in memory
-- and LISTENs on this channel to drop them the moment what they were made from changes, whoever
-- changed it. A notice is "table:key" and goes out on commit, once per key per transaction.
CREATE FUNCTION notify_change() RETURNS trigger LANGUAGE plpgsql AS $$
BEGIN
  PERFORM pg_notify('chopline_changes', TG_TABLE_NAME || ':' ||
    (CASE TG_OP WHEN 'DELETE' THEN to_jsonb(OLD) ELSE to_jsonb(NEW) END ->> TG_ARGV[0]));
  RETURN NULL;
END $$;
--> statement-breakpoint
CREATE TRIGGER sessions_notify AFTER UPDATE OR DELETE ON sessions
  FOR EACH ROW EXECUTE FUNCTION notify_change('id');
--> statement-breakpoint
CREATE TRIGGER users_notify AFTER UPDATE OR DELETE ON users
  FOR EACH ROW EXECUTE FUNCTION notify_change('id');
--> statement-breakpoint
CREATE TRIGGER lakes_notify AFTER UPDATE OR DELETE ON lakes
  FOR EACH ROW EXECUTE FUNCTION notify_change('id');
--> statement-breakpoint
CREATE TRIGGER lake_reads_notify AFTER INSERT OR UPDATE OR DELETE ON lake_reads
  FOR EACH ROW EXECUTE FUNCTION notify_change('lake_id');
--> statement-breakpoint
CREATE TRIGGER lake_days_notify AFTER INSERT OR UPDATE OR DELETE ON lake_days
  FOR EACH ROW EXECUTE FUNCTION notify_change('lake_id');
--> statement-breakpoint
CREATE TRIGGER banks_notify AFTER INSERT OR UPDATE OR DELETE ON banks
  FOR EACH ROW EXECUTE FUNCTION notify_change('user_id');
