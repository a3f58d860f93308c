//go:build !linux

package atomicfile

import "os"

func openAnon(string) (*os.File, error) { return nil, errNoAnon }

func linkAnon(*os.File, string) error { return errNoAnon }
