//go:build !linux

package main

// adviseHugePages does nothing outside Linux: the advice it gives there has
// no portable counterpart.
func adviseHugePages() {}
