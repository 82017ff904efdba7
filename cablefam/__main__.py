"""``python -m cablefam``: the command line."""

from cablefam.optimizer.cli.app import main

main()
