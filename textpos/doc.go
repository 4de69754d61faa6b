// Package textpos is the one position-carrying parse error that every reader
// in spinecert returns: [Error] names the file, the line and column (1-based;
// 0 when unknown) and what was expected, and prints as
// "file:line:col: message", as compilers do.
package textpos
