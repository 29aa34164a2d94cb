// Pseudo-terminal tests each run background server threads; two collections at a time keep the shared machine responsive.
[assembly: CollectionBehavior(MaxParallelThreads = 2)]
