// The first Intl date format a page makes loads the browser's locale data: about 30 ms on this
// kind of machine, four times that on a slow phone. Loaded async, this runs while the app's bundle
// is still downloading, so the app's first render does not wait for it.
new Intl.DateTimeFormat('en-US', { timeZone: 'UTC', hour: 'numeric' }).format(0)
