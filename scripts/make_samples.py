"""Write the invented demo profiles of sample_sections/ from exact dimensions.

Run: python scripts/make_samples.py [OUT_DIR]   (default: sample_sections/)

The definitions live in tests/support/sample_profiles.py, where the tests also use them as the
exact reference (area, centroid) of every sample file.
"""

import sys
from pathlib import Path

ROOT = Path(__file__).resolve().parents[1]
sys.path.insert(0, str(ROOT / "tests"))

from support.sample_profiles import main  # noqa: E402

if __name__ == "__main__":
    main(Path(sys.argv[1]) if len(sys.argv) > 1 else ROOT / "sample_sections")
