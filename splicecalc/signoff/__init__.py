"""Sign-off: SHA-256 digests over what a signature vouches for, signatures, revisions.

A signature (prepared / checked / approved) records name, role, date and a
digest over the canonical job inputs, every check record, the notebook's code
cells and the library version. Any later change to any of them makes the
status fall back to draft; the old signatures stay in the history.
"""

from .digest import CHECK_MIME, canonical_json, code_cells, collect_records, compute_digest
from .ledger import (ROLES, Revision, Signature, SignStatus, add_revision, issue_pdf, ledger_of,
                     sign_notebook, status_of, verify_path)

__all__ = ["CHECK_MIME", "canonical_json", "code_cells", "collect_records", "compute_digest", "ROLES",
           "Revision", "Signature", "SignStatus", "add_revision", "issue_pdf", "ledger_of",
           "sign_notebook", "status_of", "verify_path"]
