# The program as a whole: help, version, unknown commands.
siiplan_cli_test(NAME help EXIT 0 ARGS --help STDOUT "Commands:")
siiplan_cli_test(NAME version EXIT 0 ARGS --version STDOUT "siiplan [0-9]+\\.[0-9]+")
siiplan_cli_test(NAME no_arguments EXIT 2 ARGS "")
siiplan_cli_test(NAME unknown_command EXIT 2 ARGS frobnicate STDERR "^siiplan: unknown command 'frobnicate' \\(run 'siiplan --help'")
siiplan_cli_test(NAME help_unknown EXIT 2 ARGS help frobnicate STDERR "siiplan: help: unknown command")
