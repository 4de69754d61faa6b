package verify

// cryptominisatArgv runs Debian's cryptominisat5 ("cryptominisat5 --help",
// version 5.11.4): "--verb 0" prints only the answer ("s SATISFIABLE" and
// "v" lines, or "s UNSATISFIABLE"), "--threads 1" keeps it to one thread
// (also its default, written out so that a changed default cannot make it
// compete with the other backends for the cores), and the exit status is 10
// or 20. Its optional second argument is a FRAT proof file, a format
// spinecert does not read, so none is asked for: its UNSAT counts as an
// independent answer, and the checked proof must come from another backend.
var cryptominisatArgv = []string{"--verb", "0", "--threads", "1", ArgCNF}
