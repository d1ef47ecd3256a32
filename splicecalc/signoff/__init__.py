"""Sign-off a checker can trust: keys, PAdES signatures on the PDF, detached signatures on the
executed notebook, verification, issue and revisions.

* :mod:`.keys`: keys and certificates (``splicecalc keys``), the local trust list;
* :mod:`.pdfsign`: pyHanko signing and validation of the package PDF;
* :mod:`.notebook`: the canonical digest of the whole notebook and its detached signatures;
* :mod:`.package`: sign / verify / issue a package (PDF + notebook), role order;
* :mod:`.revise`: the next revision as new files;
* :mod:`.locks`: one build at a time per output folder;
* :mod:`.ledger`: protection of signed files and the build record (a hint, never trusted);
* :mod:`.digest`: the digest the job form uses to flag out-of-date results.
"""

from .digest import CHECK_MIME, canonical_json, code_cells, collect_records, compute_digest
from .ledger import ROLES, Revision, Signature, SignStatus, add_revision, ledger_of, sign_notebook, status_of

__all__ = ["CHECK_MIME", "canonical_json", "code_cells", "collect_records", "compute_digest", "ROLES",
           "Revision", "Signature", "SignStatus", "add_revision", "ledger_of", "sign_notebook", "status_of"]
