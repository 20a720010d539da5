// The first Intl date format a page makes loads the browser's locale data: 30 to 100 ms on this
// kind of machine, four times that on a slow phone. This small plain script in the page head
// arrives long before the app's bundle and pays that cost while the bundle is still downloading,
// so the app's first render does not. (Nothing on the page waits for it: the body is empty until
// the app draws.)
new Intl.DateTimeFormat('en-US', { timeZone: 'UTC', hour: 'numeric' }).format(0)
