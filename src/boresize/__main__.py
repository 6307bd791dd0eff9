"""``python -m boresize``: the ``boresize`` command."""

import sys

from boresize.cli.main import main

sys.exit(main())
