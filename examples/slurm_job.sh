#!/bin/bash
# A Slurm job for a large bandstack study on several nodes (an example: adapt the partition,
# account, node count and paths to your cluster). Every rank runs with the cores of its share of a
# node (oneTBB inside the rank); ranks ask rank 0 for blocks of columns and rank 0 writes the one
# result file, so put the output on a file system that rank 0's node can write.
#
#   sbatch examples/slurm_job.sh path/to/study.toml
#
#SBATCH --job-name=bandstack
#SBATCH --nodes=4
#SBATCH --ntasks-per-node=1
#SBATCH --cpus-per-task=32
#SBATCH --time=02:00:00
#SBATCH --output=bandstack-%j.log

set -euo pipefail
study=${1:?usage: sbatch examples/slurm_job.sh STUDY.toml}
out=${BANDSTACK_OUT:-results}
mkdir -p "$out"

# One rank per node with all its cores; blocks of 512 columns keep every rank busy and the file's
# chunks large. If the job is stopped (time limit, node failure), submitting it again resumes after
# the last block recorded in the checkpoint.
srun --mpi=pmix bandstack run "$study" --out "$out" --threads "${SLURM_CPUS_PER_TASK}" --chunk-columns 512
