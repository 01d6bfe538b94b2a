"""One Dask task per drift file: read it in blocks (CSV) or slices (NetCDF), match the positions
to segments and return the file's piece of the tally with the problems found."""
import numpy as np

from . import issues as msg
from .positions_csv import BLOCK_BYTES, read_positions
from .tally import ORDER_SHIFT, Piece, merge, piece_of_positions
from .trajectories import NotUsable, TrajectoryFile

# Trajectory numbers restart in every file: as in drift-model.ts, an offset per file keeps them apart.
TRAJECTORY_FILE_OFFSET = 100_000_000


def _fold(pieces):
    """Merges pieces as they come so that a file's blocks never pile up in memory."""
    while len(pieces) > 4:
        pieces[:] = [merge(pieces)]


def positions_file_piece(resource, file_number, calendar, matcher, block_bytes=BLOCK_BYTES):
    reader, blocks = read_positions(resource, block_bytes)
    pieces, outside = [], 0
    for block in blocks:
        order = (np.int64(file_number) << ORDER_SHIFT) + block.line
        piece = piece_of_positions(block.particle, block.time_ms, block.lon, block.lat, block.ashore, order, calendar, matcher)
        outside += piece.outside_count
        pieces.append(piece)
        _fold(pieces)
    result = merge(pieces) if pieces else Piece()
    result.issues = list(reader.issues)
    if outside:
        result.issues.append(msg.positions_outside_seasons(resource.path, outside))
    result.outside = {resource.path: outside} if outside else {}
    result.errors = any(i.severity == "error" for i in reader.issues)
    return result


def trajectory_file_piece(resource, trajectory_number, file_number, calendar, matcher, counted=True):
    """A trajectory file's piece; `counted` false when a positions CSV is listed (the file is
    then only checked, as in drift-model.ts)."""
    try:
        source = TrajectoryFile(resource.absolute_path, resource.path)
    except NotUsable as problem:
        return Piece(issues=[problem.issue], errors=True)
    issues, pieces, outside = [], [], 0
    try:
        for a, b in source.slices():
            trajectory, time_ms, lon, lat, ashore, k, _, _ = source.positions(a, b, issues)
            if not counted:
                continue
            particle = trajectory + trajectory_number * TRAJECTORY_FILE_OFFSET
            order = (np.int64(file_number) << ORDER_SHIFT) + k
            piece = piece_of_positions(particle, time_ms, lon, lat, ashore, order, calendar, matcher)
            outside += piece.outside_count
            pieces.append(piece)
            _fold(pieces)
    except (OSError, RuntimeError, ValueError, IndexError) as error:
        return Piece(issues=issues + [msg.netcdf_unreadable(resource.path, str(error))], errors=True)
    finally:
        source.close()
    result = merge(pieces) if pieces else Piece()
    result.issues = issues + ([msg.positions_outside_seasons(resource.path, outside)] if outside else [])
    result.outside = {resource.path: outside} if outside else {}
    return result
