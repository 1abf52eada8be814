"""``python -m warpwise.cli``: the ``warpwise`` command."""

import sys

from .commands import main

sys.exit(main())
