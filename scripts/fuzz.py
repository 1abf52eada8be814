"""The long fuzz run over the readers and the analysis (see DEVELOPERS.md).

Run: python scripts/fuzz.py --cases 2000 --seed 1 --out fuzz-out

The mutations and the runner live in tests/support/fuzzing.py, shared with tests/test_fuzz.py.
"""

import sys
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parents[1] / "tests"))

from support.fuzzing import main  # noqa: E402

if __name__ == "__main__":
    sys.exit(main())
