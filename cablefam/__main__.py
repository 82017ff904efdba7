"""``python -m cablefam``: the command line."""

from cablefam.optimizer.cli.app import main

# guarded: worker processes started with "spawn" import the parent's main module again
if __name__ == "__main__":
    main()
