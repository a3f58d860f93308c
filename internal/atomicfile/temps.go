package atomicfile

import (
	"os"
	"os/signal"
	"sync"
	"syscall"
)

// temps are the named temporary files being written now.
var temps struct {
	sync.Mutex
	names map[string]struct{}
}

func track(name string) {
	temps.Lock()
	defer temps.Unlock()
	if temps.names == nil {
		temps.names = map[string]struct{}{}
	}
	temps.names[name] = struct{}{}
}

func untrack(name string) {
	temps.Lock()
	defer temps.Unlock()
	delete(temps.names, name)
}

// RemoveTemps removes the named temporary files of writes still under way,
// so that a command stopped by an interrupt leaves no trace; the files the
// writes were to replace are untouched. It is safe to call from any
// goroutine, and the writes it cuts short fail.
func RemoveTemps() {
	temps.Lock()
	defer temps.Unlock()
	for n := range temps.names {
		os.Remove(n)
		delete(temps.names, n)
	}
}

// OnInterrupt guards writes under way: until stop is called, SIGINT or
// SIGTERM removes the temporary files of writes under way (RemoveTemps),
// then calls then with the signal (which typically says so and exits with
// ExitStatus). The files the writes were to replace are untouched.
func OnInterrupt(then func(os.Signal)) (stop func()) {
	ch := make(chan os.Signal, 1)
	signal.Notify(ch, os.Interrupt, syscall.SIGTERM)
	done := make(chan struct{})
	go func() {
		select {
		case s := <-ch:
			RemoveTemps()
			then(s)
		case <-done:
		}
	}()
	return func() {
		signal.Stop(ch)
		close(done)
	}
}

// ExitStatus is the status shells report for a command stopped by s: 130
// for SIGINT, 143 for SIGTERM.
func ExitStatus(s os.Signal) int {
	if s == syscall.SIGTERM {
		return 143
	}
	return 130
}
