-- A catch logged, edited, imported or deleted changes the line its angler's log adds to the Day
-- plan: its notice names the angler, and every process drops that angler's kept plans.
CREATE TRIGGER catches_notify AFTER INSERT OR UPDATE OR DELETE ON catches
  FOR EACH ROW EXECUTE FUNCTION notify_change('user_id');
