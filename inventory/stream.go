package inventory

import (
	"errors"
	"fmt"
	"runtime/debug"
)

// streamHooks are the callbacks of StreamFile and what they are told.
type streamHooks struct {
	begin     func(*Survey) error
	each      func(Object) error
	path, sha string
}

// call runs fn and turns a panic in it into an error, so that a fault in the
// caller's code is not reported as an unreadable workbook.
func call(fn func() error) (err error) {
	defer func() {
		if p := recover(); p != nil {
			err = fmt.Errorf("panic while handling a survey object: %v\n%s", p, debug.Stack())
		}
	}()
	return fn()
}

// StreamFile reads and validates the survey at path as ReadFile does, but
// hands every accepted object to each, in sheet order, instead of keeping it
// in Survey.Objects, so that memory grows with the stations, problems and
// rejected rows, not with the objects: Objects rows are validated as they are
// streamed in, and a row without any problem keeps no state (it is counted).
//
// begin is called once, before the first object, with the survey as far as it
// is known then: Path, SHA256, Site, Atmospheres, Stations and Materials (the
// Changes sheet is validated after the objects, and Problems, Rejected and
// Counts are complete only in the survey returned). The survey returned is
// the one ReadFile would return, except that Objects is nil. An error from
// begin or each stops the reading and is returned as it is; a file that is not
// a readable workbook gives an error wrapping ErrUnreadable, and begin is then
// not called.
func StreamFile(path string, opts ReadOptions, begin func(*Survey) error, each func(Object) error) (*Survey, error) {
	if begin == nil {
		begin = func(*Survey) error { return nil }
	}
	return readFile(path, opts, &streamHooks{begin: begin, each: each})
}

// stream reads the workbook with the Objects rows validated as they come.
func (r *reader) stream(h *streamHooks) (*Survey, error) {
	s, site := r.readSheets()
	s.Path, s.SHA256 = h.path, h.sha
	tables := map[string]*table{}
	for _, sh := range []string{SheetAtmospheres, SheetStations, SheetMaterials, SheetChanges} {
		tables[sh] = r.readTable(sh)
	}
	_, present := r.sheets[NormalizeName(SheetObjects)]
	tables[SheetObjects] = &table{Sheet: SheetObjects, Present: present}
	v := newValidator(s, tables)
	v.tableProblems(SheetAtmospheres, SheetStations, SheetMaterials, SheetChanges)
	mats, stations := v.begin(site)
	if err := call(func() error { return h.begin(s) }); err != nil {
		return nil, err
	}
	p := v.newObjectPass(stations, mats)
	p.quiet = true
	if len(tables[SheetChanges].Rows) == 0 {
		p.out = nil // nothing refers to the objects: their IDs need not be kept twice
	}
	t, failed := r.streamObjects(p, h)
	if failed != nil {
		return nil, failed
	}
	p.each = func(o Object) error { return call(func() error { return h.each(o) }) }
	tables[SheetObjects] = t
	v.tableProblems(SheetObjects)
	// The rows of a sheet without a header (every one rejected).
	for _, b := range t.Rows {
		if err := p.row(t, b); err != nil {
			return nil, err
		}
	}
	t.Rows = nil
	v.end(stations, p.out, t.rowsSeen)
	return s, nil
}

// objectBatch is how many accepted objects the reading goroutine of
// streamObjects hands over at a time, and objectBatches how many batches
// may wait: the reader runs at most that far ahead of the caller.
const (
	objectBatch   = 256
	objectBatches = 4
)

// streamObjects reads and validates the Objects sheet in a goroutine of its
// own while the caller's each runs in this one, on the objects in sheet
// order as they are accepted, so that reading the workbook and what the
// caller does with the objects (assessing, writing) overlap on two cores.
// Only the reading goroutine touches the reader and the validator until it
// is done; each sees the objects by value, and the survey only as begin
// saw it (the validator writes to it again after the sheet is read). An
// error from each stops the reading and is returned; a panic while reading
// is raised again here, where openAndRead turns it into an UnreadableError,
// unless each failed first.
func (r *reader) streamObjects(p *objectPass, h *streamHooks) (*table, error) {
	batches := make(chan []Object, objectBatches)
	free := make(chan []Object, objectBatches+2) // batches handed back for reuse (each gets copies)
	stop := make(chan struct{})
	type result struct {
		t     *table
		panic any
	}
	done := make(chan result, 1)
	go func() {
		var res result
		defer func() {
			res.panic = recover()
			close(batches)
			done <- res
		}()
		batch := make([]Object, 0, objectBatch)
		send := func() bool {
			select {
			case batches <- batch:
				select {
				case batch = <-free:
				default:
					batch = make([]Object, 0, objectBatch)
				}
				return true
			case <-stop:
				return false
			}
		}
		p.each = func(o Object) error {
			batch = append(batch, o)
			if len(batch) == cap(batch) && !send() {
				return errStopped
			}
			return nil
		}
		r.rowHook, r.hookSheet = func(t *table, rr rawRow) bool {
			return p.row(t, rr) == nil
		}, SheetObjects
		res.t = r.readTable(SheetObjects)
		r.rowHook = nil
		if len(batch) > 0 {
			send()
		}
	}()
	var failed error
	for b := range batches {
		for _, o := range b {
			if failed != nil {
				break
			}
			failed = call(func() error { return h.each(o) })
		}
		select {
		case free <- b[:0]:
		default:
		}
		if failed != nil {
			close(stop)
			for range batches { // let the reader see the stop and end
			}
			break
		}
	}
	res := <-done
	if failed != nil {
		return nil, failed
	}
	if res.panic != nil {
		panic(res.panic)
	}
	return res.t, nil
}

// errStopped stops the reading goroutine of streamObjects after each failed.
var errStopped = errors.New("stopped")
