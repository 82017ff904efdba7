"""The one exception type for bad user input (files, options, values)."""


class InputError(ValueError):
    """Bad input: a spec, a catalog, a design file or a CLI value.

    The message is one line that names the file, the key and the value, and says what is
    allowed. The CLI prints it and exits with code 2.
    """
