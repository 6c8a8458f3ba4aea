/**
 * Setup of the unit project (vitest.config.ts), run before each of its files is collected: the files share one module
 * graph, and the engine worker's code keeps the loaded study as module state, so every file starts with the worker as
 * it starts in the app (some files load a table while they are collected, so this is not a beforeAll hook). Engine
 * files never touch the worker: for them it is one cheap call.
 */
import { resetWorker } from '../../renderer/worker/compute.ts';

resetWorker();
