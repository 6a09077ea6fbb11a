"""stereosieve: assign the constitution and configuration of an unknown monosaccharide.

The import package is ``workbench``; the layers are ``workbench.chem`` (structure
model and reactions), ``workbench.evidence`` (observations, project file,
engine, planner), ``workbench.conformers`` (chairs, anomers, couplings,
polarimetry) and ``workbench.ui`` (notebook views). Only ``workbench.ui``
imports widget libraries.
"""

__version__ = "0.1.0"
