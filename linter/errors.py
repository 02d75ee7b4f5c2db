"""The one error type that means "Weir could not do its job" (exit code 2)."""


class WeirError(Exception):
    """A problem with Weir's own inputs: a bad contract, argument or unreadable path.

    The message is one line a person can act on; the CLI prints it and exits 2.
    Problems *in a submission* are never raised: they are findings.
    """
