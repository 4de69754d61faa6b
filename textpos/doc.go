// Package textpos is the one position-carrying parse error that every reader
// in spinecert returns: [Error] names the file, the line and column (1-based;
// 0 when unknown) and what was expected, and prints as
// "file:line:col: message", as compilers do. [CheckJSONKeys] is the key check
// every reader built on encoding/json applies, so that no JSON file means one
// thing to spinecert and another to other readers (RFC 8259, section 4: names
// within an object should be unique).
package textpos
