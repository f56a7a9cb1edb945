//go:build race

package outfile

// raceEnabled is true under go test -race: the kill test then kills its
// child fewer times (8 in the plain go test).
const raceEnabled = true
